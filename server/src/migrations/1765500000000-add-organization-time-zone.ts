import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Each organization's IANA time zone: every "today" (a status's start, "this morning", "this week",
 * the latest day a log may carry) is the organization's local day, not the server's UTC day. Existing
 * organizations keep UTC, which is what their days meant until now; their admin can change it.
 */
export class AddOrganizationTimeZone1765500000000 implements MigrationInterface {
  name = 'AddOrganizationTimeZone1765500000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE organizations ADD COLUMN time_zone varchar(64) NOT NULL DEFAULT 'UTC'`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE organizations DROP COLUMN time_zone`);
  }
}
