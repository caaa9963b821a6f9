import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Why: athletes report pain (with a red-flag screen), check in daily and log sessions; the care team
 * gets flags to act on and every person gets in-app notices.
 */
export class CreateAthleteReports1764800000000 implements MigrationInterface {
  name = 'CreateAthleteReports1764800000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE pain_reports (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        athlete_id uuid NOT NULL REFERENCES memberships(id) ON DELETE RESTRICT,
        reported_by uuid REFERENCES users(id) ON DELETE SET NULL,
        body_regions text[] NOT NULL,
        pain_now smallint NOT NULL CHECK (pain_now BETWEEN 0 AND 10),
        pain_worst_24h smallint NOT NULL CHECK (pain_worst_24h BETWEEN 0 AND 10),
        onset_date date NOT NULL,
        aggravating_patterns text[] NOT NULL DEFAULT '{}',
        started_in_training boolean NOT NULL,
        note text,
        red_flags jsonb NOT NULL,
        route varchar(10) NOT NULL CHECK (route IN ('emergency', 'urgent', 'routine')),
        case_id uuid REFERENCES cases(id) ON DELETE SET NULL,
        reported_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX pain_reports_athlete_idx ON pain_reports (organization_id, athlete_id, reported_at)`);
    await q.query(`
      CREATE TABLE check_ins (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        athlete_id uuid NOT NULL REFERENCES memberships(id) ON DELETE RESTRICT,
        date date NOT NULL,
        sleep_hours numeric(4,1) NOT NULL,
        soreness smallint NOT NULL CHECK (soreness BETWEEN 0 AND 10),
        readiness smallint NOT NULL CHECK (readiness BETWEEN 0 AND 10),
        pain_now smallint NOT NULL CHECK (pain_now BETWEEN 0 AND 10),
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE UNIQUE INDEX check_ins_athlete_date_key ON check_ins (athlete_id, date)`);
    await q.query(`
      CREATE TABLE training_logs (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        athlete_id uuid NOT NULL REFERENCES memberships(id) ON DELETE RESTRICT,
        date date NOT NULL,
        duration_minutes smallint NOT NULL CHECK (duration_minutes BETWEEN 1 AND 600),
        session_rpe smallint NOT NULL CHECK (session_rpe BETWEEN 0 AND 10),
        pain_before smallint NOT NULL CHECK (pain_before BETWEEN 0 AND 10),
        pain_during smallint NOT NULL CHECK (pain_during BETWEEN 0 AND 10),
        pain_next_morning smallint CHECK (pain_next_morning BETWEEN 0 AND 10),
        pain_ceiling smallint NOT NULL,
        sets jsonb NOT NULL DEFAULT '[]',
        notes text,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        version int NOT NULL
      )`);
    await q.query(`CREATE INDEX training_logs_athlete_date_idx ON training_logs (organization_id, athlete_id, date)`);
    await q.query(`
      CREATE TABLE flags (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        athlete_id uuid NOT NULL REFERENCES memberships(id) ON DELETE RESTRICT,
        kind varchar(30) NOT NULL,
        severity varchar(10) NOT NULL CHECK (severity IN ('emergency', 'urgent', 'routine')),
        message text NOT NULL,
        suggested_action varchar(20),
        source_type varchar(30) NOT NULL,
        source_id uuid NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        acknowledged_at timestamptz,
        acknowledged_by uuid REFERENCES users(id) ON DELETE SET NULL
      )`);
    await q.query(`CREATE INDEX flags_athlete_idx ON flags (organization_id, athlete_id, created_at)`);
    await q.query(`
      CREATE TABLE notifications (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        recipient_id uuid NOT NULL REFERENCES memberships(id) ON DELETE CASCADE,
        athlete_id uuid REFERENCES memberships(id) ON DELETE CASCADE,
        kind varchar(40) NOT NULL,
        severity varchar(10) NOT NULL,
        title varchar(200) NOT NULL,
        body text NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        read_at timestamptz
      )`);
    await q.query(`CREATE INDEX notifications_recipient_idx ON notifications (recipient_id, created_at)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE notifications`);
    await q.query(`DROP TABLE flags`);
    await q.query(`DROP TABLE training_logs`);
    await q.query(`DROP TABLE check_ins`);
    await q.query(`DROP TABLE pain_reports`);
  }
}
