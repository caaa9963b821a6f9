import type { DataSource, EntityManager } from 'typeorm';

type Db = DataSource | EntityManager;

export interface MemberContact {
  id: string;
  name: string;
  email: string;
}

/**
 * Display names of organization members (membership ids), in one query. Every place that needs a
 * person's name for a message, a notice or a letter asks here instead of writing its own join.
 * Unknown ids are absent from the map.
 */
export async function memberNames(db: Db, membershipIds: readonly string[]): Promise<Map<string, string>> {
  const contacts = await memberContacts(db, membershipIds);
  return new Map([...contacts].map(([id, c]) => [id, c.name]));
}

/** One member's display name, or `fallback` when the membership does not exist. */
export async function memberName(db: Db, membershipId: string, fallback = 'An athlete'): Promise<string> {
  return (await memberNames(db, [membershipId])).get(membershipId) ?? fallback;
}

/** Names and e-mail addresses of members, for messages that go out by e-mail. */
export async function memberContacts(db: Db, membershipIds: readonly string[]): Promise<Map<string, MemberContact>> {
  const ids = [...new Set(membershipIds)];
  if (ids.length === 0) return new Map();
  const rows: MemberContact[] = await db.query(
    `SELECT m.id, u.display_name AS name, u.email FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.id = ANY($1)`,
    [ids],
  );
  return new Map(rows.map((r) => [r.id, r]));
}
