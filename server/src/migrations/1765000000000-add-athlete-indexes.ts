import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Why: workload, pain-trend, roster and caseload reads look up one athlete's rows by date without
 * the organization in front; measured under the HTTP benchmark these were full scans.
 */
export class AddAthleteIndexes1765000000000 implements MigrationInterface {
  name = 'AddAthleteIndexes1765000000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE INDEX training_logs_athlete_date_idx2 ON training_logs (athlete_id, date)`);
    await q.query(`CREATE INDEX pain_reports_athlete_reported_idx ON pain_reports (athlete_id, reported_at)`);
    await q.query(`CREATE INDEX session_holds_athlete_idx ON session_holds (athlete_id)`);
    await q.query(`CREATE INDEX program_exceptions_athlete_status_idx ON program_exceptions (athlete_id, status)`);
    await q.query(`CREATE INDEX participation_status_changes_case_created_idx ON participation_status_changes (case_id, created_at)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX participation_status_changes_case_created_idx`);
    await q.query(`DROP INDEX program_exceptions_athlete_status_idx`);
    await q.query(`DROP INDEX session_holds_athlete_idx`);
    await q.query(`DROP INDEX pain_reports_athlete_reported_idx`);
    await q.query(`DROP INDEX training_logs_athlete_date_idx2`);
  }
}
