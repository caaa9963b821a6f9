import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Each app server keeps the signed-in actor (session row, user, memberships, care teams, groups,
 * guardian links) for a few seconds (http/actor-cache.ts). These triggers tell every server, through
 * NOTIFY on `loadline_actor_cache`, when any of that changes, whoever changes it (a command, a script,
 * a test's SQL): PostgreSQL delivers the notice when the change commits, never for a rolled-back one.
 * - a session whose contents change or that is deleted (sign-out, reset, removal): `s:` + SHA-256 of
 *   its id, so the session id itself never travels in a notice;
 * - a user row changed or deleted: `u:` + the user id;
 * - memberships, organizations, care teams, groups and guardian links: `*` (every cached actor), once
 *   per statement. They change seldom, and one athlete's change reaches every coach of theirs.
 * A session's expiry alone (the once-a-minute touch) notifies nobody: a server with an older expiry
 * reads the row again when its copy runs out.
 */
const ALL_TABLES = ['memberships', 'organizations', 'care_team_assignments', 'groups', 'group_members', 'guardian_links'];

export class AddActorCacheNotices1766600000000 implements MigrationInterface {
  name = 'AddActorCacheNotices1766600000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE FUNCTION actor_cache_notify_session() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        PERFORM pg_notify('loadline_actor_cache', 's:' || encode(sha256(convert_to(OLD.sid, 'UTF8')), 'hex'));
        RETURN NULL;
      END $$`);
    await q.query(`
      CREATE TRIGGER session_actor_cache_update AFTER UPDATE ON "session" FOR EACH ROW
        WHEN (OLD.sess::text IS DISTINCT FROM NEW.sess::text) EXECUTE FUNCTION actor_cache_notify_session()`);
    await q.query(
      `CREATE TRIGGER session_actor_cache_delete AFTER DELETE ON "session" FOR EACH ROW EXECUTE FUNCTION actor_cache_notify_session()`,
    );
    await q.query(`
      CREATE FUNCTION actor_cache_notify_user() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        PERFORM pg_notify('loadline_actor_cache', 'u:' || OLD.id::text);
        RETURN NULL;
      END $$`);
    await q.query(
      `CREATE TRIGGER users_actor_cache AFTER UPDATE OR DELETE ON users FOR EACH ROW EXECUTE FUNCTION actor_cache_notify_user()`,
    );
    await q.query(`
      CREATE FUNCTION actor_cache_notify_all() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        PERFORM pg_notify('loadline_actor_cache', '*');
        RETURN NULL;
      END $$`);
    for (const t of ALL_TABLES) {
      await q.query(
        `CREATE TRIGGER ${t}_actor_cache AFTER INSERT OR UPDATE OR DELETE OR TRUNCATE ON ${t} FOR EACH STATEMENT EXECUTE FUNCTION actor_cache_notify_all()`,
      );
    }
  }

  async down(q: QueryRunner): Promise<void> {
    for (const t of ALL_TABLES) await q.query(`DROP TRIGGER ${t}_actor_cache ON ${t}`);
    await q.query(`DROP TRIGGER users_actor_cache ON users`);
    await q.query(`DROP TRIGGER session_actor_cache_delete ON "session"`);
    await q.query(`DROP TRIGGER session_actor_cache_update ON "session"`);
    await q.query(`DROP FUNCTION actor_cache_notify_all()`);
    await q.query(`DROP FUNCTION actor_cache_notify_user()`);
    await q.query(`DROP FUNCTION actor_cache_notify_session()`);
  }
}
