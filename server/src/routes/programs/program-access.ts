import type { EntityManager } from 'typeorm';
import type { Action, AppAbility } from '../../../../policies/access';
import type { ProgramDto, ProgramSessionDto } from '../../../../policies/dto';
import { Program, ProgramSession, SessionHold } from '../../entities';
import { authorize } from '../../core/authorize';
import type { ActorWithOrg } from '../../services/actor';

/**
 * A program is authorised athlete by athlete. Staff need the action on every athlete of the program
 * (a coach cannot touch a group program that includes someone else's athlete); an athlete may read a
 * program they are part of, and then only its published sessions.
 */
export function authorizeProgram(
  ability: AppAbility,
  actor: ActorWithOrg,
  action: Action,
  program: Program | null,
): asserts program is Program {
  const rec = (athleteId: string) => ({ id: program?.id ?? '', organizationId: actor.organizationId, athleteId });
  if (program && action === 'read' && actor.roles.includes('athlete') && program.athleteIds.includes(actor.membershipId)) {
    authorize(ability, 'read', 'Program', rec(actor.membershipId));
    return;
  }
  if (!program) authorize(ability, action, 'Program', null);
  for (const athleteId of program!.athleteIds) authorize(ability, action, 'Program', rec(athleteId));
}

export function onlyPublished(actor: ActorWithOrg, program: Program): boolean {
  return (
    !(actor.roles.includes('coach') || actor.roles.includes('clinician')) ||
    !program.athleteIds.some((a) => actor.coachOf.includes(a) || actor.clinicianOf.includes(a))
  );
}

/**
 * `holdsOf`: show only that athlete's holds. An athlete reading a group program must not see a
 * teammate's breaches, which spell out the teammate's caps and 1RM (as the today view filters them).
 */
export async function programDto(m: EntityManager, program: Program, publishedOnly: boolean, holdsOf?: string): Promise<ProgramDto> {
  const sessions = await m.find(ProgramSession, {
    where: { programId: program.id, ...(publishedOnly ? { status: 'published' as const } : {}) },
    order: { date: 'ASC', createdAt: 'ASC' },
  });
  const names: { id: string; name: string }[] = await m.query(
    `SELECT m.id, u.display_name AS name FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.id = ANY($1)`,
    [program.athleteIds],
  );
  const byId = new Map(names.map((n) => [n.id, n.name]));
  return {
    id: program.id,
    name: program.name,
    athleteIds: program.athleteIds,
    athleteNames: program.athleteIds.map((id) => byId.get(id) ?? 'Unknown athlete'),
    version: program.version,
    createdAt: program.createdAt.toISOString(),
    sessions: (await sessionDtos(m, sessions, program.name)).map((s) =>
      holdsOf === undefined ? s : { ...s, holds: s.holds.filter((h) => h.athleteId === holdsOf) },
    ),
  };
}

export async function sessionDtos(
  m: EntityManager,
  sessions: ProgramSession[],
  programName: string | Map<string, string>,
): Promise<ProgramSessionDto[]> {
  const holds = sessions.length
    ? await m
        .createQueryBuilder(SessionHold, 'h')
        .where('h.session_id IN (:...ids)', { ids: sessions.map((s) => s.id) })
        .getMany()
    : [];
  return sessions.map((s) =>
    toSessionDto(
      s,
      typeof programName === 'string' ? programName : (programName.get(s.programId) ?? ''),
      holds.filter((h) => h.sessionId === s.id),
    ),
  );
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
