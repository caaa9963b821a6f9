import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Why: coaches program under the clinician's caps — an exercise library per organization,
 * athletes' baselines, programs of dated sessions, holds when a plan change makes a published
 * session breach, and exception requests decided by clinicians.
 */
export class CreatePrograms1764900000000 implements MigrationInterface {
  name = 'CreatePrograms1764900000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE exercises (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        name varchar(120) NOT NULL,
        patterns text[] NOT NULL DEFAULT '{}',
        equipment varchar(20) NOT NULL,
        ballistic boolean NOT NULL DEFAULT false,
        steps jsonb NOT NULL,
        reference_id uuid REFERENCES exercises(id) ON DELETE SET NULL,
        archived boolean NOT NULL DEFAULT false,
        created_at timestamptz NOT NULL DEFAULT now(),
        version int NOT NULL
      )`);
    await q.query(`CREATE UNIQUE INDEX exercises_org_name_key ON exercises (organization_id, name)`);
    await q.query(`
      CREATE TABLE baselines (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        athlete_id uuid NOT NULL REFERENCES memberships(id) ON DELETE CASCADE,
        exercise_id uuid NOT NULL REFERENCES exercises(id) ON DELETE CASCADE,
        kind varchar(10) NOT NULL CHECK (kind IN ('tested', 'estimated', 'logged')),
        load_kg numeric(7,2) NOT NULL,
        reps smallint NOT NULL,
        rpe numeric(3,1),
        e1rm_kg numeric(7,2) NOT NULL,
        formula varchar(10) NOT NULL,
        low_reliability boolean NOT NULL DEFAULT false,
        tested_on date NOT NULL,
        created_by uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX baselines_athlete_exercise_idx ON baselines (athlete_id, exercise_id, tested_on)`);
    await q.query(`
      CREATE TABLE programs (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        name varchar(120) NOT NULL,
        athlete_ids uuid[] NOT NULL,
        created_by uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        version int NOT NULL
      )`);
    await q.query(`CREATE INDEX programs_org_idx ON programs (organization_id)`);
    await q.query(`CREATE INDEX programs_athletes_idx ON programs USING gin (athlete_ids)`);
    await q.query(`
      CREATE TABLE program_sessions (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        program_id uuid NOT NULL REFERENCES programs(id) ON DELETE CASCADE,
        date date NOT NULL,
        title varchar(120) NOT NULL,
        content jsonb NOT NULL,
        status varchar(10) NOT NULL DEFAULT 'draft' CHECK (status IN ('draft', 'published')),
        published_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        version int NOT NULL
      )`);
    await q.query(`CREATE INDEX program_sessions_program_date_idx ON program_sessions (program_id, date)`);
    await q.query(`
      CREATE TABLE session_holds (
        session_id uuid NOT NULL REFERENCES program_sessions(id) ON DELETE CASCADE,
        athlete_id uuid NOT NULL REFERENCES memberships(id) ON DELETE CASCADE,
        organization_id uuid NOT NULL,
        breaches jsonb NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        PRIMARY KEY (session_id, athlete_id)
      )`);
    await q.query(`
      CREATE TABLE program_exceptions (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        session_id uuid NOT NULL REFERENCES program_sessions(id) ON DELETE CASCADE,
        athlete_id uuid NOT NULL REFERENCES memberships(id) ON DELETE CASCADE,
        set_ids text[] NOT NULL,
        reason text NOT NULL,
        requested_by uuid REFERENCES users(id) ON DELETE SET NULL,
        status varchar(10) NOT NULL DEFAULT 'pending' CHECK (status IN ('pending', 'granted', 'refused')),
        granted_set_ids text[] NOT NULL DEFAULT '{}',
        set_fingerprints jsonb NOT NULL DEFAULT '{}',
        decided_by uuid REFERENCES users(id) ON DELETE SET NULL,
        decided_at timestamptz,
        decision_note text,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX program_exceptions_session_idx ON program_exceptions (session_id, athlete_id)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE program_exceptions`);
    await q.query(`DROP TABLE session_holds`);
    await q.query(`DROP TABLE program_sessions`);
    await q.query(`DROP TABLE programs`);
    await q.query(`DROP TABLE baselines`);
    await q.query(`DROP TABLE exercises`);
  }
}
