import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A log made from a planned session names it (the athlete's week logs from the plan: "Log this session"), so
 * the care team can set what was done beside what was planned. Nullable: logs of unplanned training, and
 * every log before this column, have no session. A session that is deleted leaves the log (it happened) and
 * clears the link.
 */
export class AddTrainingLogSession1765836000000 implements MigrationInterface {
  name = 'AddTrainingLogSession1765836000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(
      `ALTER TABLE training_logs ADD COLUMN session_id uuid NULL CONSTRAINT training_logs_session_fkey REFERENCES program_sessions(id) ON DELETE SET NULL`,
    );
    await q.query(`CREATE INDEX training_logs_session_idx ON training_logs (session_id) WHERE session_id IS NOT NULL`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE training_logs DROP COLUMN session_id`);
  }
}
