import type { DataSource, EntityManager } from 'typeorm';
import type { AppAbility } from '../../../policies/access';
import type { AuditEntryDto } from '../../../policies/dto';
import type { AuditQueryInput } from '../../../policies/schemas';
import { accessibleWhere } from '../core/accessible';
import { orgQuery } from '../core/command';
import { verifyChain, type ChainReport } from '../services/audit';

/** The most entries one CSV export holds. */
export const EXPORT_LIMIT = 50_000;

/**
 * One query for both the screen and the CSV export: the reader's rules are part of the WHERE. `from`
 * and `to` are whole days on the organization's calendar (policies/today.ts), both included.
 */
export async function auditEntries(
  db: DataSource | EntityManager,
  ability: AppAbility,
  organization: { organizationId: string; timeZone: string },
  query: AuditQueryInput,
  limit: number,
): Promise<AuditEntryDto[]> {
  const acl = accessibleWhere(ability, 'read', 'AuditEntry', { organizationId: 'a.organization_id', athleteId: 'a.athlete_id' });
  const qb = db
    .createQueryBuilder()
    .select([
      'a.id AS id',
      'a.occurred_at AS occurred_at',
      'a.actor_user_id AS actor_user_id',
      'u.display_name AS actor_name',
      'a.action AS action',
      'a.subject_type AS subject_type',
      'a.subject_id AS subject_id',
      'a.athlete_id AS athlete_id',
      'au.display_name AS athlete_name',
      'a.before AS before',
      'a.after AS after',
      'a.request_id AS request_id',
    ])
    .from('audit_entries', 'a')
    .leftJoin('users', 'u', 'u.id = a.actor_user_id')
    .leftJoin('memberships', 'am', 'am.id = a.athlete_id')
    .leftJoin('users', 'au', 'au.id = am.user_id')
    .where('a.organization_id = :org', { org: organization.organizationId })
    .andWhere(acl.sql, acl.params)
    .orderBy('a.id', 'DESC')
    .limit(limit);
  if (query.action) qb.andWhere(`a.action LIKE :action ESCAPE '\\'`, { action: `${query.action.replace(/[%_\\]/g, '\\$&')}%` });
  if (query.actorId) qb.andWhere('a.actor_user_id = :actorId', { actorId: query.actorId });
  if (query.subjectId) qb.andWhere('a.subject_id = :subjectId', { subjectId: query.subjectId });
  if (query.athleteId) qb.andWhere('a.athlete_id = :athleteId', { athleteId: query.athleteId });
  // A local midnight `AT TIME ZONE` the organization's zone is the instant that day starts there.
  if (query.from) qb.andWhere('a.occurred_at >= (CAST(:from AS date)::timestamp AT TIME ZONE :tz)', { from: query.from });
  if (query.to) qb.andWhere('a.occurred_at < ((CAST(:to AS date) + 1)::timestamp AT TIME ZONE :tz)', { to: query.to });
  if (query.from || query.to) qb.setParameter('tz', organization.timeZone);
  if (query.before) qb.andWhere('a.id < :before', { before: query.before });
  const rows = await qb.getRawMany();
  return rows.map((r): AuditEntryDto => ({
    id: String(r.id),
    occurredAt: new Date(r.occurred_at).toISOString(),
    actorUserId: r.actor_user_id,
    actorName: r.actor_name,
    action: r.action,
    subjectType: r.subject_type,
    subjectId: r.subject_id,
    athleteId: r.athlete_id,
    athleteName: r.athlete_name,
    before: r.before,
    after: r.after,
    requestId: r.request_id,
  }));
}

/** A page of the trail, newest first, and where the next page starts (null on the last). */
export const listAuditEntries = orgQuery({
  name: 'listAuditEntries',
  async run(ctx, query: AuditQueryInput): Promise<{ entries: AuditEntryDto[]; nextBefore: number | null }> {
    const rows = await auditEntries(ctx.db, ctx.ability, ctx.actor, query, query.limit + 1);
    const entries = rows.slice(0, query.limit);
    return { entries, nextBefore: rows.length > query.limit ? Number(entries[entries.length - 1].id) : null };
  },
});

/** The organization's hash chain checked end to end; the route's access (read AuditChain) limits it to admins. */
export const verifyAuditChain = orgQuery({
  name: 'verifyAuditChain',
  run: (ctx, _input: void): Promise<ChainReport> => verifyChain('manager' in ctx.db ? ctx.db.manager : ctx.db, ctx.actor.organizationId),
});
