import { In, type EntityManager } from 'typeorm';
import type { GridCellDto, TeamGridDto, TeamProgramDto, TeamProgramSummaryDto, TeamVersionDto } from '../../../policies/dto/teams';
import type { ParticipationStatus } from '../../../policies/load/patterns';
import type { Unit } from '../../../policies/schemas/common';
import { orgQuery } from '../core/command';
import { AppError } from '../core/errors';
import { Group, Program, ProgramSession, SessionHold } from '../entities';
import type { ActorWithOrg } from '../services/actor';
import { breachesFor, statusLookup } from '../services/programs';
import { teamProgramFor } from '../services/team-access';
import { groupAthletes, versionOf } from '../services/team-fit';
import { memberNames } from './members';
import { managerOf, sessionDtos } from './programs';

/** Team programs as their coaches (and the clinicians of their athletes) read them. */

async function sessionsOf(m: EntityManager, programId: string): Promise<ProgramSession[]> {
  return m.find(ProgramSession, { where: { programId }, order: { date: 'ASC', createdAt: 'ASC' } });
}

export async function teamProgramDto(m: EntityManager, program: Program, group: Group): Promise<TeamProgramDto> {
  const sessions = await sessionsOf(m, program.id);
  const athletes = await groupAthletes(m, group.id);
  const names = await memberNames(m, athletes);
  return {
    id: program.id,
    name: program.name,
    groupId: group.id,
    groupName: group.name,
    sessions: sessions.length,
    archived: group.archived,
    version: program.version,
    athletes: athletes.map((id) => ({ id, name: names.get(id) ?? 'Unknown athlete' })),
    teamSessions: await sessionDtos(m, sessions, program.name),
  };
}

/** Whether the coach's acceptance still stands for the version's current fit. */
export function isReviewed(v: Pick<ProgramSession, 'reviewedAt' | 'needsReview' | 'proposal'>): boolean {
  return !!v.reviewedAt && !v.needsReview && !v.proposal;
}

/** A team session and its program, authorised through the group (404 for anyone outside it). */
export async function teamSessionFor(
  m: EntityManager,
  actor: ActorWithOrg,
  teamSessionId: string,
  action: 'read' | 'update',
): Promise<{ team: ProgramSession; program: Program; group: Group }> {
  const team = await m.findOne(ProgramSession, { where: { id: teamSessionId, organizationId: actor.organizationId } });
  const program = team ? await m.findOne(Program, { where: { id: team.programId } }) : null;
  if (!team || !program?.groupId) throw new AppError('not_found', 'That team session was not found.');
  const { group } = await teamProgramFor(m, actor, program.id, action);
  return { team, program, group };
}

/** One athlete's version of a team session beside it, with what the engine says of the version as it stands. */
export async function teamVersionDto(
  m: EntityManager,
  team: ProgramSession,
  program: Program,
  athleteId: string,
  unit: Unit,
  today: string,
): Promise<TeamVersionDto> {
  const version = await versionOf(m, team.id, athleteId);
  if (!version || !(await groupAthletes(m, program.groupId!)).includes(athleteId))
    throw new AppError('not_found', "That athlete's version of this team session was not found.");
  const [teamDto] = await sessionDtos(m, [team], program.name);
  const [versionDto] = await sessionDtos(m, [version], program.name);
  const names = await memberNames(m, [athleteId]);
  return {
    athleteId,
    athleteName: names.get(athleteId) ?? 'Unknown athlete',
    teamSession: teamDto,
    version: versionDto,
    state: version.fitState ?? 'as_written',
    changes: version.fitChanges,
    overridden: version.overridden,
    needsReview: version.needsReview,
    reviewed: isReviewed(version),
    proposal: version.proposal,
    breaches: version.content.exercises.length ? await breachesFor(m, program.organizationId, athleteId, [version], unit, today) : [],
  };
}

export const listTeamPrograms = orgQuery({
  name: 'team_programs.list',
  async run(ctx, input: { groupId?: string }): Promise<TeamProgramSummaryDto[]> {
    const { actor } = ctx;
    // The rule of services/team-access.ts in SQL: admins; the group's coaches; clinicians of any of its athletes.
    const rows: { id: string; name: string; group_id: string; group_name: string; archived: boolean; sessions: string; version: number }[] =
      await managerOf(ctx.db).query(
        `SELECT p.id, p.name, p.group_id, g.name AS group_name, g.archived, p.version,
              (SELECT count(*) FROM program_sessions s WHERE s.program_id = p.id) AS sessions
         FROM programs p JOIN groups g ON g.id = p.group_id AND g.organization_id = p.organization_id
        WHERE p.organization_id = $1 AND ($2::uuid IS NULL OR p.group_id = $2)
          AND ($3 OR EXISTS (SELECT 1 FROM group_members gm WHERE gm.group_id = g.id AND (
                ($4 AND gm.role = 'coach' AND gm.member_id = $5) OR ($6 AND gm.role = 'athlete' AND gm.member_id = ANY($7::uuid[])))))
        ORDER BY g.name, p.created_at DESC`,
        [
          actor.organizationId,
          input.groupId ?? null,
          actor.roles.includes('admin'),
          actor.roles.includes('coach'),
          actor.membershipId,
          actor.roles.includes('clinician'),
          actor.clinicianOf,
        ],
      );
    return rows.map((r) => ({
      id: r.id,
      name: r.name,
      groupId: r.group_id,
      groupName: r.group_name,
      sessions: Number(r.sessions),
      archived: r.archived,
      version: r.version,
    }));
  },
});

export const getTeamProgram = orgQuery({
  name: 'team_programs.get',
  async run(ctx, input: { id: string }): Promise<TeamProgramDto> {
    const m = managerOf(ctx.db);
    const { program, group } = await teamProgramFor(m, ctx.actor, input.id, 'read');
    return teamProgramDto(m, program, group);
  },
});

export const teamGrid = orgQuery({
  name: 'team_programs.grid',
  async run(ctx, input: { id: string }): Promise<TeamGridDto> {
    const m = managerOf(ctx.db);
    const { program, group } = await teamProgramFor(m, ctx.actor, input.id, 'read');
    const sessions = await sessionsOf(m, program.id);
    const athletes = await groupAthletes(m, group.id);
    const names = await memberNames(m, athletes);
    const statusToday: ParticipationStatus[] = [];
    for (const id of athletes) statusToday.push((await statusLookup(m, id))(ctx.today));
    const owners = new Map((await m.find(Program, { where: { teamProgramId: program.id } })).map((p) => [p.id, p.athleteIds[0]]));
    const versions = sessions.length
      ? (await m.find(ProgramSession, { where: { teamSessionId: In(sessions.map((s) => s.id)) } })).map((v) => ({
          ...v,
          athleteId: owners.get(v.programId),
        }))
      : [];
    const holds = versions.length ? await m.find(SessionHold, { where: { sessionId: In(versions.map((v) => v.id)) } }) : [];
    const cells: GridCellDto[] = [];
    for (const s of sessions)
      for (const athleteId of athletes) {
        const v = versions.find((x) => x.teamSessionId === s.id && x.athleteId === athleteId);
        cells.push({
          athleteId,
          teamSessionId: s.id,
          versionId: v?.id ?? null,
          state: v?.fitState ?? 'as_written',
          changes: v?.fitChanges.length ?? 0,
          overridden: v?.overridden ?? false,
          needsReview: v?.needsReview ?? false,
          reviewed: !!v && isReviewed(v),
          published: v?.status === 'published',
          held: !!v && holds.some((h) => h.sessionId === v.id && h.athleteId === athleteId),
        });
      }
    return {
      programId: program.id,
      programName: program.name,
      groupName: group.name,
      sessions: sessions.map((s) => ({
        id: s.id,
        date: s.date,
        title: s.title,
        status: s.status,
        version: s.version,
        setCount: s.content.exercises.reduce((n, r) => n + r.sets.length, 0),
      })),
      athletes: athletes.map((id, i) => ({ id, name: names.get(id) ?? 'Unknown athlete', statusToday: statusToday[i] })),
      cells,
    };
  },
});

export const getTeamVersion = orgQuery({
  name: 'team_programs.version',
  async run(ctx, input: { teamSessionId: string; athleteId: string; unit: Unit }): Promise<TeamVersionDto> {
    const m = managerOf(ctx.db);
    const { team, program } = await teamSessionFor(m, ctx.actor, input.teamSessionId, 'read');
    return teamVersionDto(m, team, program, input.athleteId, input.unit, ctx.today);
  },
});
