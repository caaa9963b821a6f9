import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Exposure for the injury report (policies/load/injury-report.ts): the practice and competition hours a
 * coach records for a group in one step — date, minutes, kind, and the athletes present (the whole
 * group unless some were unticked). Each athlete present is exposed for the session's minutes.
 */
export class CreateTeamSessionHours1766200000000 implements MigrationInterface {
  name = 'CreateTeamSessionHours1766200000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE team_session_hours (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        group_id uuid NOT NULL REFERENCES groups(id) ON DELETE CASCADE,
        date date NOT NULL,
        minutes smallint NOT NULL CHECK (minutes BETWEEN 1 AND 600),
        kind varchar(12) NOT NULL CHECK (kind IN ('practice', 'competition')),
        athlete_ids uuid[] NOT NULL,
        recorded_by uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX team_session_hours_org_date_idx ON team_session_hours (organization_id, date)`);
    await q.query(`CREATE INDEX team_session_hours_group_idx ON team_session_hours (group_id, date)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE team_session_hours`);
  }
}
