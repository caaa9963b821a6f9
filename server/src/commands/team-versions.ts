import { In } from 'typeorm';
import type { TeamPublishProblemDto, TeamVersionDto } from '../../../policies/dto/teams';
import { blockingBreaches } from '../../../policies/load/compliance';
import type { Unit } from '../../../policies/schemas/common';
import { orgCommand, type OrgCommandCtx } from '../core/command';
import { AppError, versionConflict } from '../core/errors';
import { ProgramSession, SessionHold } from '../entities';
import { memberNames } from '../queries/members';
import { teamSessionFor, teamVersionDto } from '../queries/team-programs';
import { breachesFor, statusLookup } from '../services/programs';
import { teamProgramFor } from '../services/team-access';
import { fitOneVersion, groupAthletes, versionOf, withAthleteIds } from '../services/team-fit';
import { updateVersioned } from '../services/versioned';

/**
 * Publishing a group's team sessions, and the coach's decisions on one athlete's version. Every
 * version is an ordinary session checked by the same engine as any publish (services/programs.ts).
 */

/**
 * Publishes team sessions and every athlete's version of them in one transaction, or nothing: any
 * version that needs a decision, or that the engine says goes past a cap, is a problem, and all the
 * problems are answered together (422). Athletes who are Out on a session's date are skipped.
 */
export const publishTeamSessions = orgCommand({
  name: 'team_sessions.publish',
  async run(
    ctx,
    input: { programId: string; teamSessionIds: string[]; unit: Unit },
  ): Promise<{ published: number; outSkipped: { athleteId: string; teamSessionId: string }[] }> {
    const { program, group } = await teamProgramFor(ctx.m, ctx.actor, input.programId, 'update');
    const ids = [...new Set(input.teamSessionIds)];
    const teams = await ctx.m.find(ProgramSession, { where: { id: In(ids), programId: program.id }, order: { date: 'ASC' } });
    if (teams.length !== ids.length)
      throw new AppError('not_found', 'A team session to publish was not found in this team program.', {
        teamSessionIds: ['must all be sessions of this team program'],
      });
    const empty = teams.find((t) => t.content.exercises.length === 0);
    if (empty) throw new AppError('unprocessable', `"${empty.title}" is empty and cannot be published: add at least one exercise.`);
    const athletes = await groupAthletes(ctx.m, group.id);
    const names = await memberNames(ctx.m, athletes);
    const problems: TeamPublishProblemDto[] = [];
    const outSkipped: { athleteId: string; teamSessionId: string }[] = [];
    const toPublish: ProgramSession[] = [];
    for (const athleteId of athletes) {
      const statusOn = await statusLookup(ctx.m, athleteId);
      const mine: { team: ProgramSession; version: ProgramSession }[] = [];
      for (const team of teams) {
        if (statusOn(team.date) === 'out') {
          outSkipped.push({ athleteId, teamSessionId: team.id });
          continue;
        }
        const version =
          (await versionOf(ctx.m, team.id, athleteId)) ??
          (await fitOneVersion(ctx.m, team, program, athleteId, input.unit, ctx.today)).version;
        mine.push({ team, version });
      }
      // The athlete's versions are checked together, so two sessions of one week count toward its limits.
      const breaches = blockingBreaches(
        await breachesFor(
          ctx.m,
          ctx.actor.organizationId,
          athleteId,
          mine.map((x) => x.version),
          input.unit,
          ctx.today,
        ),
      );
      for (const { team, version } of mine) {
        const words = breaches.filter((b) => b.sessionId === version.id).map((b) => b.message);
        if (version.content.exercises.length === 0)
          words.unshift(
            'Nothing is left in this version (it was fitted while the athlete was Out, or everything was dropped): reset it to fit again, or edit it.',
          );
        else if (version.fitState === 'needs_decision' && !version.overridden && !version.reviewedAt)
          words.unshift(
            `Something could not be made to fit and was dropped: ${[
              ...new Set(version.fitChanges.filter((c) => c.kind === 'dropped').map((c) => c.note)),
            ].join('; ')}. Accept the drop, edit the version, or ask the clinician for an exception.`,
          );
        if (words.length)
          problems.push({
            athleteId,
            athleteName: names.get(athleteId) ?? 'Unknown athlete',
            teamSessionId: team.id,
            date: team.date,
            title: team.title,
            problems: words,
          });
        else toPublish.push(version);
      }
    }
    if (problems.length)
      throw new AppError(
        'unprocessable',
        `Nothing was published: ${problems.length} athlete version${problems.length > 1 ? 's need' : ' needs'} attention first. Each line below says who, which session and what.`,
        undefined,
        { problems },
      );
    for (const team of teams)
      if (team.status !== 'published')
        await ctx.m.update(ProgramSession, { id: team.id }, {
          status: 'published',
          publishedAt: () => 'now()',
          version: () => 'version + 1',
        } as never);
    for (const v of toPublish) {
      if (v.status !== 'published')
        await ctx.m.update(ProgramSession, { id: v.id }, {
          status: 'published',
          publishedAt: () => 'now()',
          version: () => 'version + 1',
        } as never);
      await ctx.m.delete(SessionHold, { sessionId: v.id });
    }
    for (const team of teams)
      await ctx.audit({
        action: 'team_session.published',
        subjectType: 'ProgramSession',
        subjectId: team.id,
        after: {
          date: team.date,
          versions: toPublish.filter((v) => v.teamSessionId === team.id).map((v) => v.id),
          outSkipped: outSkipped.filter((o) => o.teamSessionId === team.id).map((o) => o.athleteId),
        },
      });
    return { published: toPublish.length, outSkipped };
  },
});

type VersionInput = { teamSessionId: string; athleteId: string; version: number; unit: Unit };

async function loadVersion(ctx: OrgCommandCtx, input: VersionInput) {
  const { team, program } = await teamSessionFor(ctx.m, ctx.actor, input.teamSessionId, 'update');
  const version = (await groupAthletes(ctx.m, program.groupId!)).includes(input.athleteId)
    ? await versionOf(ctx.m, team.id, input.athleteId)
    : null;
  if (!version) throw new AppError('not_found', "That athlete's version of this team session was not found.");
  if (version.version !== input.version) throw versionConflict('version');
  return { team, program, version };
}

/** A published version whose new content the engine passes comes off hold; one that does not is refused (422). */
async function checkPublished(ctx: OrgCommandCtx, version: ProgramSession, athleteId: string, unit: Unit) {
  if (version.status !== 'published' || version.content.exercises.length === 0) return;
  const breaches = blockingBreaches(await breachesFor(ctx.m, ctx.actor.organizationId, athleteId, [version], unit, ctx.today));
  if (breaches.length)
    throw new AppError('unprocessable', 'This version is published and would go past a cap. Each line below says which limit.', undefined, {
      breaches: [{ athleteId, breaches }],
    });
  await ctx.m.delete(SessionHold, { sessionId: version.id });
}

export const acceptVersion = orgCommand({
  name: 'team_versions.accept',
  async run(ctx, input: VersionInput): Promise<TeamVersionDto> {
    const { team, program, version } = await loadVersion(ctx, input);
    const proposal = version.proposal;
    if (proposal) {
      // The proposal passes the engine before it replaces anything, whatever state the athlete is in now.
      const probe = { ...version, content: proposal.content, status: 'published' as const };
      const breaches = blockingBreaches(
        await breachesFor(ctx.m, ctx.actor.organizationId, input.athleteId, [probe], input.unit, ctx.today),
      );
      if (breaches.length)
        throw new AppError(
          'unprocessable',
          'The waiting proposal no longer fits the limits in force. Reset the version to fit it again.',
          undefined,
          {
            breaches: [{ athleteId: input.athleteId, breaches }],
          },
        );
    }
    await updateVersioned(
      ctx.m,
      ProgramSession,
      version.id,
      input.version,
      {
        ...(proposal
          ? { content: proposal.content as never, fitState: proposal.state, fitChanges: proposal.changes as never, overridden: false }
          : {}),
        proposal: null,
        needsReview: false,
        reviewedAt: () => 'now()',
        updatedAt: () => 'now()',
      },
      'version',
    );
    if (proposal && version.status === 'published') await ctx.m.delete(SessionHold, { sessionId: version.id });
    await ctx.audit({
      action: 'team_version.accepted',
      subjectType: 'ProgramSession',
      subjectId: version.id,
      athleteId: input.athleteId,
      before: { content: version.content, state: version.fitState },
      after: proposal ? { content: proposal.content, state: proposal.state } : { reviewed: true },
    });
    return teamVersionDto(ctx.m, team, program, input.athleteId, input.unit, ctx.today);
  },
});

export const resetVersion = orgCommand({
  name: 'team_versions.reset',
  async run(ctx, input: VersionInput): Promise<TeamVersionDto> {
    const { team, program, version } = await loadVersion(ctx, input);
    const { version: next } = await fitOneVersion(ctx.m, team, program, input.athleteId, input.unit, ctx.today, true);
    await checkPublished(ctx, next, input.athleteId, input.unit);
    await ctx.audit({
      action: 'team_version.reset',
      subjectType: 'ProgramSession',
      subjectId: version.id,
      athleteId: input.athleteId,
      before: { content: version.content, overridden: version.overridden },
      after: { content: next.content, state: next.fitState },
    });
    return teamVersionDto(ctx.m, team, program, input.athleteId, input.unit, ctx.today);
  },
});

/**
 * The team's sets as written, kept as a hand edit: the engine will refuse to publish it until the
 * clinician grants an exception on its sets (the existing exception routes on the version session).
 */
export const asWrittenVersion = orgCommand({
  name: 'team_versions.as_written',
  async run(ctx, input: VersionInput): Promise<TeamVersionDto> {
    const { team, program, version } = await loadVersion(ctx, input);
    const content = withAthleteIds(team.content, input.athleteId);
    await updateVersioned(
      ctx.m,
      ProgramSession,
      version.id,
      input.version,
      {
        content: content as never,
        date: team.date,
        fitState: 'as_written',
        fitChanges: [] as never,
        overridden: true,
        proposal: null,
        needsReview: false,
        reviewedAt: () => 'now()',
        updatedAt: () => 'now()',
      },
      'version',
    );
    await checkPublished(ctx, await ctx.m.findOneByOrFail(ProgramSession, { id: version.id }), input.athleteId, input.unit);
    await ctx.audit({
      action: 'team_version.as_written',
      subjectType: 'ProgramSession',
      subjectId: version.id,
      athleteId: input.athleteId,
      before: { content: version.content },
      after: { content },
    });
    return teamVersionDto(ctx.m, team, program, input.athleteId, input.unit, ctx.today);
  },
});
