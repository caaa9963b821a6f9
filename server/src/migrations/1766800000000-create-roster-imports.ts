import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Bringing a roster from a CSV: one row per uploaded CSV. The checked rows are kept as JSON from the
 * preview until the background job has imported them, so the import works on exactly the file the
 * admin previewed; `processed` is how far the job got, so a retried job resumes instead of starting over.
 */
export class CreateRosterImports1766800000000 implements MigrationInterface {
  name = 'CreateRosterImports1766800000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE roster_imports (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        created_by uuid REFERENCES users(id) ON DELETE SET NULL,
        status varchar(12) NOT NULL CHECK (status IN ('previewed', 'queued', 'running', 'done', 'failed')),
        file_name varchar(200),
        file_sha256 char(64) NOT NULL,
        rows jsonb NOT NULL,
        total_rows integer NOT NULL,
        processed integer NOT NULL DEFAULT 0,
        created_rows integer NOT NULL DEFAULT 0,
        updated_rows integer NOT NULL DEFAULT 0,
        unchanged_rows integer NOT NULL DEFAULT 0,
        skipped_rows integer NOT NULL DEFAULT 0,
        invitations integer NOT NULL DEFAULT 0,
        error varchar(500),
        created_at timestamptz NOT NULL DEFAULT now(),
        started_at timestamptz,
        finished_at timestamptz,
        version integer NOT NULL DEFAULT 1
      )`);
    await q.query(`CREATE INDEX roster_imports_org_idx ON roster_imports (organization_id, created_at DESC)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE roster_imports`);
  }
}
