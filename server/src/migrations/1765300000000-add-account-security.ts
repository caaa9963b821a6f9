import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Why: password reset (ASVS 5.0 V6.3.8, V6.4.1, V6.4.3) and two-step sign-in (ASVS 5.0 V6.3.3).
 * - password_reset_tokens: only the SHA-256 of each link's token, single use, short-lived.
 * - user_totp: the authenticator secret, encrypted (AES-256-GCM), and the last time step used, so a
 *   code cannot be replayed within its window.
 * - totp_recovery_codes: one-time codes, keyed hashes only.
 * - Indexes on the session table's signed-in (or half signed-in) user, so a reset can end that
 *   person's other sessions without scanning every session row.
 */
export class AddAccountSecurity1765300000000 implements MigrationInterface {
  name = 'AddAccountSecurity1765300000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE password_reset_tokens (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        token_hash char(64) NOT NULL,
        expires_at timestamptz NOT NULL,
        used_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE UNIQUE INDEX password_reset_tokens_token_hash_key ON password_reset_tokens (token_hash)`);
    await q.query(`CREATE INDEX password_reset_tokens_user_idx ON password_reset_tokens (user_id)`);

    await q.query(`
      CREATE TABLE user_totp (
        user_id uuid PRIMARY KEY REFERENCES users(id) ON DELETE CASCADE,
        secret_enc text NOT NULL,
        enabled_at timestamptz,
        last_used_step bigint,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);

    await q.query(`
      CREATE TABLE totp_recovery_codes (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        code_hash char(64) NOT NULL,
        used_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX totp_recovery_codes_user_idx ON totp_recovery_codes (user_id)`);

    // connect-pg-simple keeps passport's user id inside the session JSON.
    await q.query(`CREATE INDEX session_passport_user_idx ON "session" ((sess -> 'passport' ->> 'user'))`);
    // A session waiting for a second-step code holds the person's id here instead (see services/sign-in.ts).
    await q.query(`CREATE INDEX session_pending_user_idx ON "session" ((sess -> 'pendingSignIn' ->> 'userId'))`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX session_pending_user_idx`);
    await q.query(`DROP INDEX session_passport_user_idx`);
    await q.query(`DROP TABLE totp_recovery_codes`);
    await q.query(`DROP TABLE user_totp`);
    await q.query(`DROP TABLE password_reset_tokens`);
  }
}
