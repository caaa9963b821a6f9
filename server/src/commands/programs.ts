import { randomUUID } from 'node:crypto';
import type { ProgramDto, ProgramSessionDto } from '../../../policies/dto';
import { blockingBreaches, type Breach } from '../../../policies/load/compliance';
import type { Unit } from '../../../policies/schemas/common';
import type { ProgramCreateInput, SessionContent, SessionCreateInput, SessionUpdateInput } from '../../../policies/schemas/programs';
import { addDays } from '../../../policies/today';
import { orgCommand, type OrgCommandCtx } from '../core/command';
import { AppError, versionConflict } from '../core/errors';
import { Program, ProgramSession, SessionHold } from '../entities';
import { programDtos, sessionDtos, sessionWithProgram } from '../queries/programs';
import { requireMemberWithRole } from '../services/org-members';
import { authorizeProgram, breachesForAthletes } from '../services/programs';
import { updateVersioned } from '../services/versioned';

/**
 * Programs and their sessions. None of these changes what an athlete may do: a session is checked
 * against the limits when it is published, and an edit of a published one is checked again (422),
 * so they are not "limits changes" (commands/limits.ts).
 */

function refuseBreaches(results: { athleteId: string; breaches: Breach[] }[], what: string) {
  const blocking = results
    .map((r) => ({ athleteId: r.athleteId, breaches: blockingBreaches(r.breaches) }))
    .filter((r) => r.breaches.length);
  if (blocking.length) {
    const count = blocking.reduce((a, r) => a + r.breaches.length, 0);
    throw new AppError(
      'unprocessable',
      `This session cannot be ${what}: ${count} planned set${count > 1 ? 's go' : ' goes'} past a cap. Each line below says which limit, by how much, and what would fit.`,
      undefined,
      { breaches: blocking },
    );
  }
}

/** New ids for copied content, so exceptions granted on the original never cover the copy. */
function withNewIds(content: SessionContent): SessionContent {
  return { exercises: content.exercises.map((e) => ({ ...e, id: randomUUID(), sets: e.sets.map((s) => ({ ...s, id: randomUUID() })) })) };
}

function assertUniqueIds(content: SessionContent) {
  const ids = content.exercises.flatMap((e) => [e.id, ...e.sets.map((s) => s.id)]);
  if (new Set(ids).size !== ids.length)
    throw new AppError('validation_failed', 'Please check the form: content has repeated ids.', {
      content: ['has repeated exercise or set ids'],
    });
}

async function programFor(ctx: OrgCommandCtx, id: string, action: 'update'): Promise<Program> {
  const p = await ctx.m.findOne(Program, { where: { id, organizationId: ctx.actor.organizationId } });
  authorizeProgram(ctx.ability, ctx.actor, action, p);
  return p;
}

async function sessionDto(ctx: OrgCommandCtx, sessionId: string, programName: string): Promise<ProgramSessionDto> {
  return (await sessionDtos(ctx.m, [await ctx.m.findOneByOrFail(ProgramSession, { id: sessionId })], programName))[0];
}

async function requireAthletes(ctx: OrgCommandCtx, athleteIds: string[]) {
  for (const id of athleteIds) await requireMemberWithRole(ctx.m, ctx.actor.organizationId, id, 'athlete', 'athleteIds');
}

export const createProgram = orgCommand({
  name: 'programs.create',
  async run(ctx, input: ProgramCreateInput): Promise<ProgramDto> {
    const athleteIds = [...new Set(input.athleteIds)];
    await requireAthletes(ctx, athleteIds);
    const draft = ctx.m.create(Program, { organizationId: ctx.actor.organizationId, name: input.name, athleteIds, createdBy: ctx.userId });
    authorizeProgram(ctx.ability, ctx.actor, 'create', { id: '', athleteIds });
    const saved = await ctx.m.save(draft);
    await ctx.audit({
      action: 'program.created',
      subjectType: 'Program',
      subjectId: saved.id,
      athleteId: athleteIds.length === 1 ? athleteIds[0] : null,
      after: { name: input.name, athleteIds },
    });
    return (await programDtos(ctx.m, ctx.actor, [saved]))[0];
  },
});

export const updateProgram = orgCommand({
  name: 'programs.update',
  async run(ctx, input: { id: string; version: number; name?: string; athleteIds?: string[] }): Promise<ProgramDto> {
    const { id, version, ...changes } = input;
    const p = await programFor(ctx, id, 'update');
    if (changes.athleteIds) {
      changes.athleteIds = [...new Set(changes.athleteIds)];
      await requireAthletes(ctx, changes.athleteIds);
      authorizeProgram(ctx.ability, ctx.actor, 'update', { id: p.id, athleteIds: changes.athleteIds });
      const published = await ctx.m.count(ProgramSession, { where: { programId: p.id, status: 'published' } });
      if (published > 0 && changes.athleteIds.some((a) => !p.athleteIds.includes(a))) {
        throw new AppError(
          'conflict',
          'This program has published sessions: unpublish them before adding athletes, so every session is checked for the new athletes.',
        );
      }
    }
    await updateVersioned(ctx.m, Program, p.id, version, { ...changes, updatedAt: () => 'now()' }, 'program');
    // An athlete taken off the program keeps no hold on its sessions: they are no longer theirs (the
    // roster counted them, and no re-check of that athlete would ever look at them again).
    const removed = changes.athleteIds ? p.athleteIds.filter((a) => !changes.athleteIds!.includes(a)) : [];
    if (removed.length)
      await ctx.m.query(
        `DELETE FROM session_holds WHERE athlete_id = ANY($1) AND session_id IN (SELECT id FROM program_sessions WHERE program_id = $2)`,
        [removed, p.id],
      );
    await ctx.audit({
      action: 'program.updated',
      subjectType: 'Program',
      subjectId: p.id,
      before: { name: p.name, athleteIds: p.athleteIds },
      after: changes,
    });
    return (await programDtos(ctx.m, ctx.actor, [await ctx.m.findOneByOrFail(Program, { id: p.id })]))[0];
  },
});

export const addSession = orgCommand({
  name: 'sessions.create',
  async run(ctx, input: SessionCreateInput & { programId: string }): Promise<ProgramSessionDto> {
    assertUniqueIds(input.content);
    const p = await programFor(ctx, input.programId, 'update');
    const s = await ctx.m.save(
      ctx.m.create(ProgramSession, {
        organizationId: ctx.actor.organizationId,
        programId: p.id,
        date: input.date,
        title: input.title,
        content: input.content,
        status: 'draft',
      }),
    );
    await ctx.audit({
      action: 'session.created',
      subjectType: 'ProgramSession',
      subjectId: s.id,
      after: { programId: p.id, date: s.date, title: s.title },
    });
    return (await sessionDtos(ctx.m, [s], p.name))[0];
  },
});

/** An edit of a published session is checked again on the organization's today and refused (422) if it breaches. */
export const editSession = orgCommand({
  name: 'sessions.update',
  changesLimits: true,
  async run(ctx, input: SessionUpdateInput & { id: string; unit: Unit }): Promise<ProgramSessionDto> {
    if (input.content) assertUniqueIds(input.content);
    const { session, program } = await sessionWithProgram(ctx.m, ctx.ability, ctx.actor, input.id, 'update');
    if (session.version !== input.version) throw versionConflict('session');
    const next = {
      ...session,
      date: input.date ?? session.date,
      title: input.title ?? session.title,
      content: input.content ?? session.content,
    } as ProgramSession;
    if (session.status === 'published')
      refuseBreaches(await breachesForAthletes(ctx.m, program, [next], input.unit, ctx.today), 'changed while published');
    await updateVersioned(
      ctx.m,
      ProgramSession,
      session.id,
      input.version,
      {
        date: next.date,
        title: next.title,
        content: next.content as never,
        updatedAt: () => 'now()',
        // An athlete's version of a team session edited by hand: the team session no longer rewrites it.
        ...(session.teamSessionId ? { overridden: true, needsReview: false, proposal: null, reviewedAt: () => 'now()' } : {}),
      },
      'session',
    );
    // A published session that fits again comes off hold.
    if (session.status === 'published') await ctx.m.delete(SessionHold, { sessionId: session.id });
    await ctx.audit({
      action: 'session.updated',
      subjectType: 'ProgramSession',
      subjectId: session.id,
      before: { date: session.date, title: session.title, content: session.content },
      after: { date: next.date, title: next.title, content: next.content },
    });
    // A lighter (or moved) published session can free up its old week for a later held session.
    await weekMayHaveFreedUp(ctx, session.status === 'published', program.athleteIds);
    return sessionDto(ctx, session.id, program.name);
  },
});

/**
 * Taking a published session away (deleting or unpublishing it) lowers the week's hard-set counts, so a
 * later session held for the weekly limit may fit again: the athletes' weeks go through the limits path.
 */
async function weekMayHaveFreedUp(ctx: OrgCommandCtx, wasPublished: boolean, athleteIds: string[]): Promise<void> {
  if (!wasPublished) return ctx.limitsUnchanged();
  await ctx.limitsChanged({ athleteIds, reason: 'A published session was taken back; the week was checked again.' });
}

export const deleteSession = orgCommand({
  name: 'sessions.delete',
  changesLimits: true,
  async run(ctx, input: { id: string }): Promise<void> {
    const { session, program } = await sessionWithProgram(ctx.m, ctx.ability, ctx.actor, input.id, 'update');
    await ctx.m.delete(ProgramSession, { id: session.id });
    await ctx.audit({
      action: 'session.deleted',
      subjectType: 'ProgramSession',
      subjectId: session.id,
      before: { date: session.date, title: session.title, status: session.status },
    });
    await weekMayHaveFreedUp(ctx, session.status === 'published', program.athleteIds);
  },
});

/** Publishing is refused (422) with the breach list if any set goes past a cap for any athlete of the program. */
export const publishSession = orgCommand({
  name: 'sessions.publish',
  async run(ctx, input: { id: string; version: number; unit: Unit }): Promise<ProgramSessionDto> {
    const { session, program } = await sessionWithProgram(ctx.m, ctx.ability, ctx.actor, input.id, 'update');
    if (session.version !== input.version) throw versionConflict('session');
    if (session.content.exercises.length === 0)
      throw new AppError('unprocessable', 'An empty session cannot be published: add at least one exercise.');
    const results = await breachesForAthletes(ctx.m, program, [session], input.unit, ctx.today);
    refuseBreaches(results, 'published');
    await updateVersioned(
      ctx.m,
      ProgramSession,
      session.id,
      input.version,
      { status: 'published', publishedAt: () => 'now()', updatedAt: () => 'now()' },
      'session',
    );
    await ctx.m.delete(SessionHold, { sessionId: session.id });
    const waived = results.flatMap((r) =>
      r.breaches.filter((b) => b.waived).map((b) => ({ athleteId: r.athleteId, setId: b.setId, rule: b.rule })),
    );
    await ctx.audit({
      action: 'session.published',
      subjectType: 'ProgramSession',
      subjectId: session.id,
      athleteId: program.athleteIds.length === 1 ? program.athleteIds[0] : null,
      after: { date: session.date, athletes: program.athleteIds, waivedByException: waived },
    });
    return sessionDto(ctx, session.id, program.name);
  },
});

export const unpublishSession = orgCommand({
  name: 'sessions.unpublish',
  changesLimits: true,
  async run(ctx, input: { id: string; version: number }): Promise<ProgramSessionDto> {
    const { session, program } = await sessionWithProgram(ctx.m, ctx.ability, ctx.actor, input.id, 'update');
    await updateVersioned(
      ctx.m,
      ProgramSession,
      session.id,
      input.version,
      { status: 'draft', publishedAt: null, updatedAt: () => 'now()' },
      'session',
    );
    await ctx.m.delete(SessionHold, { sessionId: session.id });
    await ctx.audit({ action: 'session.unpublished', subjectType: 'ProgramSession', subjectId: session.id });
    await weekMayHaveFreedUp(ctx, session.status === 'published', program.athleteIds);
    return sessionDto(ctx, session.id, program.name);
  },
});

export const copyWeek = orgCommand({
  name: 'programs.copy_week',
  async run(ctx, input: { id: string; fromWeekStart: string; toWeekStart: string }): Promise<ProgramSessionDto[]> {
    const { id, ...weeks } = input;
    const p = await programFor(ctx, id, 'update');
    const offset = Math.round((Date.parse(weeks.toWeekStart) - Date.parse(weeks.fromWeekStart)) / 86_400_000);
    const source = await ctx.m
      .createQueryBuilder(ProgramSession, 's')
      .where('s.program_id = :p', { p: p.id })
      .andWhere('s.date >= :from AND s.date < CAST(:from AS date) + 7', { from: weeks.fromWeekStart })
      .orderBy('s.date')
      .getMany();
    const copies = [];
    for (const s of source) {
      copies.push(
        await ctx.m.save(
          ctx.m.create(ProgramSession, {
            organizationId: s.organizationId,
            programId: p.id,
            date: addDays(s.date, offset),
            title: s.title,
            content: withNewIds(s.content),
            status: 'draft',
          }),
        ),
      );
    }
    await ctx.audit({
      action: 'program.week_copied',
      subjectType: 'Program',
      subjectId: p.id,
      after: { ...weeks, sessions: copies.length },
    });
    return sessionDtos(ctx.m, copies, p.name);
  },
});

export const shiftDrafts = orgCommand({
  name: 'programs.shift',
  async run(ctx, input: { id: string; fromDate: string; days: number }): Promise<{ moved: number; note: string }> {
    const { id, ...shift } = input;
    const p = await programFor(ctx, id, 'update');
    const result = await ctx.m
      .createQueryBuilder()
      .update(ProgramSession)
      .set({ date: () => `date + ${Number(shift.days)}`, version: () => 'version + 1', updatedAt: () => 'now()' } as never)
      .where(`program_id = :p AND status = 'draft' AND date >= :from`, { p: p.id, from: shift.fromDate })
      .execute();
    await ctx.audit({
      action: 'program.shifted',
      subjectType: 'Program',
      subjectId: p.id,
      after: { ...shift, sessions: result.affected ?? 0 },
    });
    return { moved: result.affected ?? 0, note: 'Only drafts move; published sessions keep their dates.' };
  },
});
