import type { ProgramSessionDto } from '../../../policies/dto';
import type { TeamProgramDto } from '../../../policies/dto/teams';
import { blockingBreaches } from '../../../policies/load/compliance';
import type { Unit } from '../../../policies/schemas/common';
import type { SessionContent } from '../../../policies/schemas/programs';
import { orgCommand, type OrgCommandCtx } from '../core/command';
import { AppError, versionConflict } from '../core/errors';
import { Group, Program, ProgramSession, SessionHold } from '../entities';
import { sessionDtos } from '../queries/programs';
import { teamProgramDto, teamSessionFor } from '../queries/team-programs';
import { breachesFor } from '../services/programs';
import { authorizeGroupWork, teamProgramFor } from '../services/team-access';
import { fitVersions, type FitOutcome } from '../services/team-fit';
import { updateVersioned } from '../services/versioned';

/**
 * A group's team program and its sessions as written. Every change of a team session fits each
 * athlete's version again at once (services/team-fit.ts), except versions the coach edited by hand,
 * which are kept and marked for review.
 */

function assertUniqueIds(content: SessionContent) {
  const ids = content.exercises.flatMap((e) => [e.id, ...e.sets.map((s) => s.id)]);
  if (new Set(ids).size !== ids.length)
    throw new AppError('validation_failed', 'Please check the form: content has repeated ids.', {
      content: ['has repeated exercise or set ids'],
    });
}

export const createTeamProgram = orgCommand({
  name: 'team_programs.create',
  async run(ctx, input: { groupId: string; name: string }): Promise<TeamProgramDto> {
    const group = await ctx.m.findOne(Group, { where: { id: input.groupId, organizationId: ctx.actor.organizationId, archived: false } });
    if (!group) throw new AppError('not_found', 'That group was not found.', { groupId: ['is not a group of this organization'] });
    await authorizeGroupWork(ctx.m, ctx.actor, group, 'update', 'team program');
    const saved = await ctx.m.save(
      ctx.m.create(Program, {
        organizationId: ctx.actor.organizationId,
        name: input.name,
        athleteIds: [],
        groupId: group.id,
        createdBy: ctx.userId,
      }),
    );
    await ctx.audit({
      action: 'team_program.created',
      subjectType: 'Program',
      subjectId: saved.id,
      after: { name: input.name, groupId: group.id },
    });
    return teamProgramDto(ctx.m, saved, group);
  },
});

export const renameTeamProgram = orgCommand({
  name: 'team_programs.rename',
  async run(ctx, input: { id: string; name: string; version: number }): Promise<TeamProgramDto> {
    const { program, group } = await teamProgramFor(ctx.m, ctx.actor, input.id, 'update');
    await updateVersioned(ctx.m, Program, program.id, input.version, { name: input.name, updatedAt: () => 'now()' }, 'team program');
    // The athletes' own programs carry the team program's name: it is what they see.
    await ctx.m.update(Program, { teamProgramId: program.id }, { name: input.name });
    await ctx.audit({
      action: 'team_program.renamed',
      subjectType: 'Program',
      subjectId: program.id,
      before: { name: program.name },
      after: { name: input.name },
    });
    return teamProgramDto(ctx.m, await ctx.m.findOneByOrFail(Program, { id: program.id }), group);
  },
});

async function teamSessionDto(ctx: OrgCommandCtx, id: string, programName: string): Promise<ProgramSessionDto> {
  return (await sessionDtos(ctx.m, [await ctx.m.findOneByOrFail(ProgramSession, { id })], programName))[0];
}

export const addTeamSession = orgCommand({
  name: 'team_sessions.create',
  async run(
    ctx,
    input: { programId: string; date: string; title: string; content: SessionContent; unit: Unit },
  ): Promise<ProgramSessionDto> {
    assertUniqueIds(input.content);
    const { program } = await teamProgramFor(ctx.m, ctx.actor, input.programId, 'update');
    const team = await ctx.m.save(
      ctx.m.create(ProgramSession, {
        organizationId: ctx.actor.organizationId,
        programId: program.id,
        date: input.date,
        title: input.title,
        content: input.content,
        status: 'draft',
      }),
    );
    const outcomes = await fitVersions(ctx.m, ctx.actor.organizationId, team.id, ctx.today, input.unit);
    await ctx.audit({
      action: 'team_session.created',
      subjectType: 'ProgramSession',
      subjectId: team.id,
      after: { programId: program.id, date: team.date, title: team.title, versions: outcomes.map(stateOf) },
    });
    return teamSessionDto(ctx, team.id, program.name);
  },
});

const stateOf = (o: FitOutcome) => ({ athleteId: o.athleteId, state: o.version.fitState, overridden: o.version.overridden });

/**
 * A published version rewritten by an edit must still pass the engine (as an edit of a published
 * session, commands/programs.ts); one that does is released from any hold.
 */
async function checkRewrittenPublished(ctx: OrgCommandCtx, outcomes: FitOutcome[], unit: Unit): Promise<string[]> {
  const touched: string[] = [];
  const problems: { athleteId: string; breaches: unknown[] }[] = [];
  for (const o of outcomes) {
    if (!o.rewritten || o.version.status !== 'published') continue;
    touched.push(o.athleteId);
    const breaches = blockingBreaches(await breachesFor(ctx.m, ctx.actor.organizationId, o.athleteId, [o.version], unit, ctx.today));
    if (breaches.length) problems.push({ athleteId: o.athleteId, breaches });
    else await ctx.m.delete(SessionHold, { sessionId: o.version.id });
  }
  if (problems.length)
    throw new AppError(
      'unprocessable',
      'This team session cannot be changed while published: some athletes’ versions would go past a cap. Each line below says who and which limit.',
      undefined,
      { breaches: problems },
    );
  return touched;
}

export const editTeamSession = orgCommand({
  name: 'team_sessions.update',
  changesLimits: true,
  async run(
    ctx,
    input: { id: string; version: number; date?: string; title?: string; content?: SessionContent; unit: Unit },
  ): Promise<ProgramSessionDto> {
    if (input.content) assertUniqueIds(input.content);
    const { team, program } = await teamSessionFor(ctx.m, ctx.actor, input.id, 'update');
    if (team.version !== input.version) throw versionConflict('team session');
    const next = { date: input.date ?? team.date, title: input.title ?? team.title, content: input.content ?? team.content };
    await updateVersioned(
      ctx.m,
      ProgramSession,
      team.id,
      input.version,
      { ...next, content: next.content as never, updatedAt: () => 'now()' },
      'team session',
    );
    const outcomes = await fitVersions(ctx.m, ctx.actor.organizationId, team.id, ctx.today, input.unit);
    const touched = await checkRewrittenPublished(ctx, outcomes, input.unit);
    await ctx.audit({
      action: 'team_session.updated',
      subjectType: 'ProgramSession',
      subjectId: team.id,
      before: { date: team.date, title: team.title, content: team.content },
      after: { ...next, versions: outcomes.map(stateOf) },
    });
    // A lighter (or moved) published version can free its old week for a later held session.
    if (touched.length)
      await ctx.limitsChanged({ athleteIds: touched, reason: 'A published team session changed; the week was checked again.' });
    else ctx.limitsUnchanged();
    return teamSessionDto(ctx, team.id, program.name);
  },
});

export const deleteTeamSession = orgCommand({
  name: 'team_sessions.delete',
  changesLimits: true,
  async run(ctx, input: { id: string }): Promise<void> {
    const { team } = await teamSessionFor(ctx.m, ctx.actor, input.id, 'update');
    const published: { athlete_id: string }[] = await ctx.m.query(
      `SELECT p.athlete_ids[1] AS athlete_id FROM program_sessions s JOIN programs p ON p.id = s.program_id
        WHERE s.team_session_id = $1 AND s.status = 'published'`,
      [team.id],
    );
    // The versions go with it (program_sessions.team_session_id cascades); logs keep their sets.
    await ctx.m.delete(ProgramSession, { id: team.id });
    await ctx.audit({
      action: 'team_session.deleted',
      subjectType: 'ProgramSession',
      subjectId: team.id,
      before: { date: team.date, title: team.title, status: team.status },
    });
    if (published.length)
      await ctx.limitsChanged({
        athleteIds: published.map((r) => r.athlete_id),
        reason: 'A published team session was taken back; the week was checked again.',
      });
    else ctx.limitsUnchanged();
  },
});
