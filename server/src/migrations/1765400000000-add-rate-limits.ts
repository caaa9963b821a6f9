import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Counters for the sign-in, reset and letter-check limits, shared by every app process on the
 * database (an in-memory count would let each process allow the full limit). Keys are hashed.
 */
export class AddRateLimits1765400000000 implements MigrationInterface {
  name = 'AddRateLimits1765400000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE rate_limit_counters (
        key char(64) PRIMARY KEY,
        hits int NOT NULL,
        reset_at timestamptz NOT NULL
      )`);
    await q.query(`CREATE INDEX rate_limit_counters_reset_at ON rate_limit_counters (reset_at)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE rate_limit_counters`);
  }
}
