import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A person's whole record, exported on request (GDPR Art. 15 and 20): one row per request. The ZIP is built
 * by a pg-boss job (so a crash between request and build loses nothing) and kept in object storage under
 * `storage_key`; the e-mailed link's secret is stored only as its SHA-256 (`token_hash`), like reset tokens,
 * and works until `expires_at`. `requested_by` is the user who asked: only they download it. `athlete_id` is
 * the athlete membership the record is about (the requester's own, or a guardian's minor). Requests are
 * counted per requester over a day (the rate limit reads `created_at`).
 */
export class CreateRecordExports1767000000000 implements MigrationInterface {
  name = 'CreateRecordExports1767000000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE record_exports (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        athlete_id uuid NOT NULL REFERENCES memberships(id) ON DELETE CASCADE,
        requested_by uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        status varchar(16) NOT NULL DEFAULT 'queued' CHECK (status IN ('queued', 'ready', 'failed')),
        storage_key varchar(200),
        size_bytes bigint,
        sha256 char(64),
        token_hash char(64) UNIQUE,
        problem text,
        created_at timestamptz NOT NULL DEFAULT now(),
        ready_at timestamptz,
        expires_at timestamptz,
        downloaded_at timestamptz
      )`);
    await q.query(`CREATE INDEX record_exports_requester_idx ON record_exports (requested_by, created_at DESC)`);
    await q.query(`CREATE INDEX record_exports_org_idx ON record_exports (organization_id, athlete_id)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE record_exports`);
  }
}
