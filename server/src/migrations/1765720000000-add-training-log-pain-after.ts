import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Pain after the session (that evening), 0–10: the pain-monitoring model (Silbernagel et al. 2007,
 * AJSM 35:897–906) asks for it to stay at or under the ceiling and to have settled by the next
 * morning. Nullable: logs made before this column, and logs whose evening is not reported yet, have
 * no evening score, and the rule reads "not reported" as answering no condition.
 */
export class AddTrainingLogPainAfter1765720000000 implements MigrationInterface {
  name = 'AddTrainingLogPainAfter1765720000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(
      `ALTER TABLE training_logs ADD COLUMN pain_after smallint NULL CONSTRAINT training_logs_pain_after_check CHECK (pain_after BETWEEN 0 AND 10)`,
    );
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE training_logs DROP COLUMN pain_after`);
  }
}
