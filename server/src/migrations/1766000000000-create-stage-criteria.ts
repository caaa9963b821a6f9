import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Stage criteria (criteria-based progression; Bern consensus, Ardern et al. 2016). The criteria themselves
 * live inside each stage of a plan version (restriction_plan_versions.stages, JSON), so they are versioned
 * with the plan. Here:
 * - stage_criterion_readings: what the clinician assessed for one criterion (value or yes/no, note)
 *   and the athlete's readiness ratings (0–10), each dated and tied to the plan's stage id;
 * - stage_decisions: each move to the next stage, a shared decision with who agreed, how many days
 *   earlier (or later) than the dates, and how many criteria were met at the time.
 * Rows go with their plan (ON DELETE CASCADE).
 */
export class CreateStageCriteria1766000000000 implements MigrationInterface {
  name = 'CreateStageCriteria1766000000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE stage_criterion_readings (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        plan_id uuid NOT NULL REFERENCES restriction_plans(id) ON DELETE CASCADE,
        athlete_id uuid NOT NULL REFERENCES memberships(id) ON DELETE RESTRICT,
        stage_id uuid NOT NULL,
        kind varchar(12) NOT NULL CONSTRAINT stage_criterion_readings_kind_check CHECK (kind IN ('assessment', 'readiness')),
        criterion_id uuid NULL,
        reading_date date NOT NULL,
        value numeric(12, 3) NULL,
        met boolean NULL,
        note varchar(500) NULL,
        recorded_by uuid NULL REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT stage_criterion_readings_criterion_check CHECK ((kind = 'assessment') = (criterion_id IS NOT NULL))
      )`);
    await q.query(`CREATE INDEX stage_criterion_readings_plan_idx ON stage_criterion_readings (plan_id, stage_id, reading_date)`);
    await q.query(`
      CREATE TABLE stage_decisions (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        plan_id uuid NOT NULL REFERENCES restriction_plans(id) ON DELETE CASCADE,
        athlete_id uuid NOT NULL REFERENCES memberships(id) ON DELETE RESTRICT,
        from_stage_id uuid NOT NULL,
        to_stage_id uuid NOT NULL,
        effective_date date NOT NULL,
        planned_date date NOT NULL,
        days_early int NOT NULL,
        agreed_by text[] NOT NULL,
        criteria_met int NOT NULL,
        criteria_total int NOT NULL,
        plan_version int NOT NULL,
        note varchar(500) NULL,
        decided_by uuid NULL REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX stage_decisions_plan_idx ON stage_decisions (plan_id, created_at)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE stage_decisions`);
    await q.query(`DROP TABLE stage_criterion_readings`);
  }
}
