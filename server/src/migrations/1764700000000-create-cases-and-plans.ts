import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Why: clinicians record cases, participation status over time and versioned restriction plans;
 * audit entries gain the athlete they concern so clinicians can follow their own athletes' trail.
 */
export class CreateCasesAndPlans1764700000000 implements MigrationInterface {
  name = 'CreateCasesAndPlans1764700000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE cases (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        athlete_id uuid NOT NULL REFERENCES memberships(id) ON DELETE RESTRICT,
        body_regions text[] NOT NULL CONSTRAINT cases_body_regions_check CHECK (cardinality(body_regions) > 0),
        onset_date date NOT NULL,
        diagnosis varchar(200),
        clinical_notes text,
        review_date date,
        opened_by uuid REFERENCES users(id) ON DELETE SET NULL,
        closed_on date,
        closing_note text,
        opened_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        version int NOT NULL
      )`);
    await q.query(`CREATE INDEX cases_athlete_idx ON cases (organization_id, athlete_id)`);
    await q.query(`
      CREATE TABLE participation_status_changes (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        athlete_id uuid NOT NULL REFERENCES memberships(id) ON DELETE RESTRICT,
        case_id uuid NOT NULL REFERENCES cases(id) ON DELETE CASCADE,
        status varchar(10) NOT NULL CONSTRAINT participation_status_check CHECK (status IN ('out', 'limited', 'full')),
        effective_from date NOT NULL,
        note text,
        set_by uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX participation_status_changes_case_idx ON participation_status_changes (case_id, effective_from)`);
    await q.query(`CREATE INDEX participation_status_changes_athlete_idx ON participation_status_changes (organization_id, athlete_id)`);
    await q.query(`
      CREATE TABLE restriction_plans (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        athlete_id uuid NOT NULL REFERENCES memberships(id) ON DELETE RESTRICT,
        case_id uuid NOT NULL REFERENCES cases(id) ON DELETE CASCADE,
        version int NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE UNIQUE INDEX restriction_plans_case_key ON restriction_plans (case_id)`);
    await q.query(`CREATE INDEX restriction_plans_athlete_idx ON restriction_plans (organization_id, athlete_id)`);
    await q.query(`
      CREATE TABLE restriction_plan_versions (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        plan_id uuid NOT NULL REFERENCES restriction_plans(id) ON DELETE CASCADE,
        version int NOT NULL,
        stages jsonb NOT NULL,
        guidance text NOT NULL DEFAULT '',
        change_note varchar(500),
        created_by uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE UNIQUE INDEX restriction_plan_versions_key ON restriction_plan_versions (plan_id, version)`);
    await q.query(`ALTER TABLE audit_entries ADD COLUMN athlete_id uuid`);
    await q.query(`CREATE INDEX audit_entries_athlete_idx ON audit_entries (organization_id, athlete_id, id)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX audit_entries_athlete_idx`);
    await q.query(`ALTER TABLE audit_entries DROP COLUMN athlete_id`);
    await q.query(`DROP TABLE restriction_plan_versions`);
    await q.query(`DROP TABLE restriction_plans`);
    await q.query(`DROP TABLE participation_status_changes`);
    await q.query(`DROP TABLE cases`);
  }
}
