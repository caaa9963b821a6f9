import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Logs made offline are sent again when the phone gets signal back, and a send whose answer was lost
 * is sent once more: each carries an `Idempotency-Key`, and this table keeps, per organization, user
 * and key, what the first request was (a SHA-256 of method, path and body) and the answer it got, so
 * a replay gets the same answer and nothing is stored twice (http/idempotency.ts). `status` is null
 * while the first request is still running. Infrastructure like `rate_limit_counters`: written with
 * plain SQL from the HTTP layer, no entity, no audit entry (the command it guards writes its own).
 */
export class CreateIdempotencyKeys1766500000000 implements MigrationInterface {
  name = 'CreateIdempotencyKeys1766500000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE idempotency_keys (
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        key uuid NOT NULL,
        fingerprint char(64) NOT NULL,
        status smallint,
        response jsonb,
        created_at timestamptz NOT NULL DEFAULT now(),
        completed_at timestamptz,
        CONSTRAINT idempotency_keys_pkey PRIMARY KEY (organization_id, user_id, key)
      )`);
    // The sweep of old keys reads by age.
    await q.query(`CREATE INDEX idempotency_keys_created_idx ON idempotency_keys (created_at)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE idempotency_keys`);
  }
}
