import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Plan templates: a restriction plan's stages written as days from the plan's
 * start, shared by the organization's clinicians. `stages` holds each stage whole (limits, pain
 * ceiling, label, exit criteria) with `startOffset`/`endOffset`/`reviewOffset` in place of its id and
 * dates (policies/load/plan-template.ts). The author is a membership, because the access rules compare
 * it with the reader's membership. A template is archived, never deleted: audit entries name it.
 */
export class CreatePlanTemplates1766100000000 implements MigrationInterface {
  name = 'CreatePlanTemplates1766100000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE plan_templates (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        author_id uuid NOT NULL REFERENCES memberships(id),
        name varchar(120) NOT NULL,
        description text NOT NULL DEFAULT '',
        stages jsonb NOT NULL,
        guidance text NOT NULL DEFAULT '',
        archived boolean NOT NULL DEFAULT false,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        version int NOT NULL
      )`);
    await q.query(`CREATE INDEX plan_templates_org_idx ON plan_templates (organization_id, lower(name)) WHERE NOT archived`);
    await q.query(`CREATE INDEX plan_templates_author_idx ON plan_templates (author_id)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE plan_templates`);
  }
}
