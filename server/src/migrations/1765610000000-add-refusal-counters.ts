import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Refusals (403, a member's 404, CSRF, sign-in limits) are audited, but the trail is append-only and
 * hash-chained, so a count cannot be updated in place. The first refusal per trail, actor, action,
 * route and minute is written at once; later ones in that minute only add to a row here, and when
 * the minute is over the row becomes one summary entry with the count and is deleted
 * (services/refusals.ts). One attacker therefore adds at most two entries per route and minute.
 */
export class AddRefusalCounters1765610000000 implements MigrationInterface {
  name = 'AddRefusalCounters1765610000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE refusal_counters (
        chain text NOT NULL,
        actor_key text NOT NULL,
        action varchar(100) NOT NULL,
        route varchar(300) NOT NULL,
        minute timestamptz NOT NULL,
        hits int NOT NULL,
        organization_id uuid NULL,
        actor_user_id uuid NULL,
        address varchar(64) NULL,
        CONSTRAINT refusal_counters_pkey PRIMARY KEY (chain, actor_key, action, route, minute)
      )`);
    await q.query(`CREATE INDEX refusal_counters_minute ON refusal_counters (minute)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE refusal_counters`);
  }
}
