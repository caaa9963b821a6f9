import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Private calendar feeds (iCalendar, RFC 5545): an athlete or coach subscribes a phone calendar to an
 * iCalendar URL holding a secret token. Only the token's SHA-256 is kept, so a copy of the database
 * cannot be used to read anyone's feed; the URL is shown once, when the feed is turned on. Turning it
 * off (or making a new URL) stamps `revoked_at` rather than deleting, so the audit trail's entries keep
 * naming a row. One live feed per membership: the partial unique index.
 */
export class CreateCalendarFeeds1766900000000 implements MigrationInterface {
  name = 'CreateCalendarFeeds1766900000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE calendar_feeds (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        organization_id uuid NOT NULL REFERENCES organizations(id) ON DELETE CASCADE,
        membership_id uuid NOT NULL REFERENCES memberships(id) ON DELETE CASCADE,
        token_hash char(64) NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        revoked_at timestamptz
      )`);
    await q.query(`CREATE UNIQUE INDEX calendar_feeds_token_idx ON calendar_feeds (token_hash)`);
    await q.query(`CREATE UNIQUE INDEX calendar_feeds_live_idx ON calendar_feeds (membership_id) WHERE revoked_at IS NULL`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE calendar_feeds`);
  }
}
