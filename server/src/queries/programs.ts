import { EntityManager, In, type DataSource } from 'typeorm';
import type { AppAbility } from '../../../policies/access';
import type { ProgramDto, ProgramSessionDto } from '../../../policies/dto';
import type { Unit } from '../../../policies/schemas/common';
import { accessibleWhere } from '../core/accessible';
import { orgQuery } from '../core/command';
import { AppError } from '../core/errors';
import { Program, ProgramSession, SessionHold } from '../entities';
import type { ActorWithOrg } from '../services/actor';
import { authorizeProgram, breachesForAthletes, onlyPublished } from '../services/programs';
import { memberNames } from './members';

type Db = DataSource | EntityManager;

/** The engine reads through an EntityManager: the transaction's, or the pool's outside one. */
export const managerOf = (db: Db): EntityManager => (db instanceof EntityManager ? db : db.manager);

/**
 * A session and its program, authorised: a draft the caller may not see is not revealed by any
 * action on it (404 before any 403), and an action other than read needs it on every athlete.
 */
export async function sessionWithProgram(
  db: Db,
  ability: AppAbility,
  actor: ActorWithOrg,
  sessionId: string,
  action: 'read' | 'update',
): Promise<{ session: ProgramSession; program: Program }> {
  const m = managerOf(db);
  const session = await m.findOne(ProgramSession, { where: { id: sessionId, organizationId: actor.organizationId } });
  const program = session ? await m.findOne(Program, { where: { id: session.programId } }) : null;
  authorizeProgram(ability, actor, 'read', program);
  if (!session || (session.status !== 'published' && onlyPublished(actor, program)))
    throw new AppError('not_found', 'That session was not found.');
  if (action !== 'read') authorizeProgram(ability, actor, action, program);
  return { session, program };
}

export function toSessionDto(
  s: Pick<ProgramSession, 'id' | 'programId' | 'date' | 'title' | 'content' | 'status' | 'publishedAt' | 'version'>,
  programName: string,
  holds: Pick<SessionHold, 'athleteId' | 'breaches'>[],
): ProgramSessionDto {
  return {
    id: s.id,
    programId: s.programId,
    programName,
    date: s.date,
    title: s.title,
    content: s.content,
    status: s.status,
    publishedAt: s.publishedAt ? s.publishedAt.toISOString() : null,
    version: s.version,
    holds: holds.map((h) => ({ athleteId: h.athleteId, breaches: h.breaches })),
  };
}

/** Sessions with every athlete's holds (staff views). */
export async function sessionDtos(db: Db, sessions: ProgramSession[], programName: string): Promise<ProgramSessionDto[]> {
  const holds = sessions.length ? await db.getRepository(SessionHold).find({ where: { sessionId: In(sessions.map((s) => s.id)) } }) : [];
  return sessions.map((s) =>
    toSessionDto(
      s,
      programName,
      holds.filter((h) => h.sessionId === s.id),
    ),
  );
}

/**
 * Programs as their reader sees them, in three queries whatever their number: an athlete gets the
 * published sessions only, and only their own holds (a teammate's breaches spell out the teammate's
 * caps and 1RM, as the athlete's day filters them).
 */
export async function programDtos(db: Db, actor: ActorWithOrg, programs: Program[]): Promise<ProgramDto[]> {
  if (programs.length === 0) return [];
  const sessions = await db.getRepository(ProgramSession).find({
    where: { programId: In(programs.map((p) => p.id)) },
    order: { date: 'ASC', createdAt: 'ASC' },
  });
  const holds = sessions.length ? await db.getRepository(SessionHold).find({ where: { sessionId: In(sessions.map((s) => s.id)) } }) : [];
  const names = await memberNames(db, [...new Set(programs.flatMap((p) => p.athleteIds))]);
  return programs.map((p) => {
    const athleteView = onlyPublished(actor, p);
    const mine = sessions.filter((s) => s.programId === p.id && (!athleteView || s.status === 'published'));
    return {
      id: p.id,
      name: p.name,
      athleteIds: p.athleteIds,
      athleteNames: p.athleteIds.map((id) => names.get(id) ?? 'Unknown athlete'),
      version: p.version,
      createdAt: p.createdAt.toISOString(),
      sessions: mine.map((s) =>
        toSessionDto(
          s,
          p.name,
          holds.filter((h) => h.sessionId === s.id && (!athleteView || h.athleteId === actor.membershipId)),
        ),
      ),
    };
  });
}

/**
 * Programs the reader may open, filtered in SQL by the same rules as one program (authorizeProgram):
 * staff need read on every athlete of the program; an athlete reads the programs they are part of.
 * `athleteId` narrows to programs of one athlete the reader may read programs of.
 */
export const listPrograms = orgQuery({
  name: 'programs.list',
  async run(ctx, input: { athleteId?: string }): Promise<ProgramDto[]> {
    const { actor } = ctx;
    const acl = accessibleWhere(
      ctx.ability,
      'read',
      'Program',
      { id: 'p.id', organizationId: 'p.organization_id', athleteId: 'pa.athlete_id' },
      'acl',
      { arrays: true },
    );
    const readableAthlete = (param: string) => `EXISTS (SELECT 1 FROM (SELECT CAST(:${param} AS uuid) AS athlete_id) pa WHERE ${acl.sql})`;
    const everyAthlete = `NOT EXISTS (SELECT 1 FROM unnest(p.athlete_ids) AS pa(athlete_id) WHERE NOT ${acl.sql})`;
    const asAthlete = actor.roles.includes('athlete') ? ` OR (:me = ANY(p.athlete_ids) AND ${readableAthlete('me')})` : '';
    const qb = managerOf(ctx.db)
      .createQueryBuilder(Program, 'p')
      .where('p.organization_id = :org', { org: actor.organizationId })
      .andWhere('cardinality(p.athlete_ids) > 0')
      .andWhere(`(${everyAthlete}${asAthlete})`, { ...acl.params, me: actor.membershipId })
      .orderBy('p.created_at', 'DESC');
    if (input.athleteId)
      qb.andWhere(`:athleteId = ANY(p.athlete_ids) AND ${readableAthlete('athleteId')}`, { ...acl.params, athleteId: input.athleteId });
    return programDtos(ctx.db, actor, await qb.getMany());
  },
});

export const getProgram = orgQuery({
  name: 'programs.get',
  async run(ctx, input: { id: string }): Promise<ProgramDto> {
    const p = await managerOf(ctx.db).findOne(Program, { where: { id: input.id, organizationId: ctx.actor.organizationId } });
    authorizeProgram(ctx.ability, ctx.actor, 'read', p);
    return (await programDtos(ctx.db, ctx.actor, [p]))[0];
  },
});

/** The publish check without publishing: each athlete's breaches, on the organization's today. */
export const checkSession = orgQuery({
  name: 'sessions.check',
  async run(ctx, input: { id: string; unit: Unit }) {
    const m = managerOf(ctx.db);
    const { session, program } = await sessionWithProgram(m, ctx.ability, ctx.actor, input.id, 'read');
    return { results: await breachesForAthletes(m, program, [session], input.unit, ctx.today) };
  },
});
