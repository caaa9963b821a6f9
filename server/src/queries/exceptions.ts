import type { DataSource, EntityManager } from 'typeorm';
import type { AppAbility } from '../../../policies/access';
import type { ExceptionDto } from '../../../policies/dto';
import { accessibleWhere } from '../core/accessible';
import { orgQuery } from '../core/command';

/** Exception requests the reader may see (filtered in SQL by their rules), newest first. */
export async function exceptionDtos(
  db: DataSource | EntityManager,
  ability: AppAbility,
  organizationId: string,
  where: { id?: string; athleteId?: string; state?: 'pending' | 'all' },
): Promise<ExceptionDto[]> {
  const acl = accessibleWhere(ability, 'read', 'ProgramException', {
    organizationId: 'x.organization_id',
    athleteId: 'x.athlete_id',
    id: 'x.id',
  });
  const qb = db
    .createQueryBuilder()
    .select([
      'x.id AS id',
      'x.session_id AS "sessionId"',
      's.date AS "sessionDate"',
      's.title AS "sessionTitle"',
      'x.athlete_id AS "athleteId"',
      'au.display_name AS "athleteName"',
      'x.set_ids AS "setIds"',
      'x.reason AS reason',
      'ru.display_name AS "requestedByName"',
      'x.status AS status',
      'x.granted_set_ids AS "grantedSetIds"',
      'du.display_name AS "decidedByName"',
      'x.decided_at AS "decidedAt"',
      'x.decision_note AS "decisionNote"',
      'x.created_at AS "createdAt"',
    ])
    .from('program_exceptions', 'x')
    .innerJoin('program_sessions', 's', 's.id = x.session_id')
    .innerJoin('memberships', 'am', 'am.id = x.athlete_id')
    .innerJoin('users', 'au', 'au.id = am.user_id')
    .leftJoin('users', 'ru', 'ru.id = x.requested_by')
    .leftJoin('users', 'du', 'du.id = x.decided_by')
    .where('x.organization_id = :org', { org: organizationId })
    .andWhere(acl.sql, acl.params)
    .orderBy('x.created_at', 'DESC')
    .limit(300);
  if (where.id) qb.andWhere('x.id = :id', { id: where.id });
  if (where.athleteId) qb.andWhere('x.athlete_id = :a', { a: where.athleteId });
  if (where.state === 'pending') qb.andWhere(`x.status = 'pending'`);
  const rows = await qb.getRawMany();
  return rows.map((r) => ({
    ...r,
    createdAt: new Date(r.createdAt).toISOString(),
    decidedAt: r.decidedAt ? new Date(r.decidedAt).toISOString() : null,
  }));
}

export const listExceptions = orgQuery({
  name: 'exceptions.list',
  run(ctx, input: { athleteId?: string; state: 'pending' | 'all' }): Promise<ExceptionDto[]> {
    return exceptionDtos(ctx.db, ctx.ability, ctx.actor.organizationId, input);
  },
});
