import { randomUUID } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { z } from 'zod';
import type { Breach } from '../../../../policies/load/compliance';
import { blockingBreaches } from '../../../../policies/load/compliance';
import {
  CopyWeekSchema,
  OrgParamsSchema,
  ProgramCreateSchema,
  ProgramItemParamsSchema,
  ProgramUpdateSchema,
  SessionCreateSchema,
  SessionUpdateSchema,
  ShiftDatesSchema,
  UuidSchema,
  VersionSchema,
  type SessionContent,
} from '../../../../policies/schemas';
import { Program, ProgramSession, SessionHold } from '../../entities';
import { AppError, versionConflict } from '../../core/errors';
import { orgRoute, type RouteDef } from '../../http/route';
import type { ActorWithOrg } from '../../services/actor';
import { breachesFor } from '../../services/programs';
import { orgToday } from '../../../../policies/today';
import { requireMemberWithRole } from '../../services/org-members';
import { shiftDate } from '../../services/training-logs';
import { updateVersioned } from '../../services/versioned';
import { authorizeProgram, onlyPublished, programDto, sessionDtos } from './program-access';
import type { AppAbility } from '../../../../policies/access';
import type { Unit } from '../../../../policies/schemas/common';

async function loadSessionWithProgram(
  m: EntityManager,
  ability: AppAbility,
  actor: ActorWithOrg,
  sessionId: string,
  action: 'read' | 'update',
) {
  const session = await m.findOne(ProgramSession, { where: { id: sessionId, organizationId: actor.organizationId } });
  const program = session ? await m.findOne(Program, { where: { id: session.programId } }) : null;
  authorizeProgram(ability, actor, 'read', program);
  // A draft the caller may not see is not revealed by any action on it (404 before any 403).
  if (!session || (session.status !== 'published' && onlyPublished(actor, program)))
    throw new AppError('not_found', 'That session was not found.');
  if (action !== 'read') authorizeProgram(ability, actor, action, program);
  return { session, program };
}

/** Every athlete of the program, checked on the session's date. */
async function checkForAthletes(m: EntityManager, program: Program, sessions: ProgramSession[], unit: Unit, today: string) {
  const out: { athleteId: string; breaches: Breach[] }[] = [];
  for (const athleteId of program.athleteIds)
    out.push({ athleteId, breaches: await breachesFor(m, program.organizationId, athleteId, sessions, unit, today) });
  return out;
}

function refuseBreaches(results: { athleteId: string; breaches: Breach[] }[], what: string) {
  const blocking = results
    .map((r) => ({ athleteId: r.athleteId, breaches: blockingBreaches(r.breaches) }))
    .filter((r) => r.breaches.length);
  if (blocking.length) {
    const count = blocking.reduce((a, r) => a + r.breaches.length, 0);
    throw new AppError(
      'unprocessable',
      `This session cannot be ${what}: ${count} planned set${count > 1 ? 's go' : ' goes'} past a cap. Each breach below says which cap, by how much, and what would fit.`,
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

export const programRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/programs',
    summary: 'Programs I may see (athletes: those they are part of, published sessions only)',
    access: { kind: 'org', action: 'read', subject: 'Program' },
    params: OrgParamsSchema,
    query: z.strictObject({ athleteId: UuidSchema.optional() }),
    async handler({ ds, ability, actor, query }) {
      const visible = [
        ...new Set([...actor.coachOf, ...actor.clinicianOf, ...(actor.roles.includes('athlete') ? [actor.membershipId] : [])]),
      ];
      const ids = query.athleteId ? visible.filter((v) => v === query.athleteId) : visible;
      if (ids.length === 0) return [];
      const programs = await ds
        .getRepository(Program)
        .createQueryBuilder('p')
        .where('p.organization_id = :org', { org: actor.organizationId })
        .andWhere('p.athlete_ids && CAST(:ids AS uuid[])', { ids })
        .orderBy('p.created_at', 'DESC')
        .getMany();
      const out = [];
      for (const p of programs) {
        try {
          authorizeProgram(ability, actor, 'read', p);
        } catch {
          continue;
        }
        out.push(await programDto(ds.manager, p, onlyPublished(actor, p), onlyPublished(actor, p) ? actor.membershipId : undefined));
      }
      return out;
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/programs',
    summary: 'Start a program for one athlete or a group',
    access: { kind: 'org', action: 'create', subject: 'Program' },
    params: OrgParamsSchema,
    body: ProgramCreateSchema,
    status: 201,
    async handler({ ability, actor, user, body, tx }) {
      return tx(async (m, audit) => {
        const athleteIds = [...new Set(body.athleteIds)];
        for (const id of athleteIds) await requireMemberWithRole(m, actor.organizationId, id, 'athlete', 'athleteIds');
        const draft = m.create(Program, { organizationId: actor.organizationId, name: body.name, athleteIds, createdBy: user.id });
        authorizeProgram(ability, actor, 'create', { ...draft, id: '' } as Program);
        const saved = await m.save(draft);
        await audit({
          action: 'program.created',
          subjectType: 'Program',
          subjectId: saved.id,
          athleteId: athleteIds.length === 1 ? athleteIds[0] : null,
          after: { name: body.name, athleteIds },
        });
        return programDto(m, saved, false);
      });
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/programs/:id',
    summary: 'A program with its sessions',
    access: { kind: 'org', action: 'read', subject: 'Program' },
    params: ProgramItemParamsSchema,
    async handler({ ds, ability, actor, params }) {
      const p = await ds.getRepository(Program).findOne({ where: { id: params.id, organizationId: actor.organizationId } });
      authorizeProgram(ability, actor, 'read', p);
      return programDto(ds.manager, p, onlyPublished(actor, p), onlyPublished(actor, p) ? actor.membershipId : undefined);
    },
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/programs/:id',
    summary: 'Rename a program or change its athletes',
    access: { kind: 'org', action: 'update', subject: 'Program' },
    params: ProgramItemParamsSchema,
    body: ProgramUpdateSchema,
    async handler({ ability, actor, params, body, tx }) {
      const { version, ...changes } = body;
      return tx(async (m, audit) => {
        const p = await m.findOne(Program, { where: { id: params.id, organizationId: actor.organizationId } });
        authorizeProgram(ability, actor, 'update', p);
        if (changes.athleteIds) {
          changes.athleteIds = [...new Set(changes.athleteIds)];
          for (const id of changes.athleteIds) await requireMemberWithRole(m, actor.organizationId, id, 'athlete', 'athleteIds');
          authorizeProgram(ability, actor, 'update', { ...p, athleteIds: changes.athleteIds } as Program);
          const published = await m.count(ProgramSession, { where: { programId: p.id, status: 'published' } });
          if (published > 0 && changes.athleteIds.some((a) => !p.athleteIds.includes(a))) {
            throw new AppError(
              'conflict',
              'This program has published sessions: unpublish them before adding athletes, so every session is checked for the new athletes.',
            );
          }
        }
        await updateVersioned(m, Program, p.id, version, { ...changes, updatedAt: () => 'now()' }, 'program');
        await audit({
          action: 'program.updated',
          subjectType: 'Program',
          subjectId: p.id,
          before: { name: p.name, athleteIds: p.athleteIds },
          after: changes,
        });
        return programDto(m, await m.findOneByOrFail(Program, { id: p.id }), false);
      });
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/programs/:id/sessions',
    summary: 'Add a dated session (a draft) to a program',
    access: { kind: 'org', action: 'update', subject: 'Program' },
    params: ProgramItemParamsSchema,
    body: SessionCreateSchema,
    status: 201,
    async handler({ ability, actor, params, body, tx }) {
      assertUniqueIds(body.content);
      return tx(async (m, audit) => {
        const p = await m.findOne(Program, { where: { id: params.id, organizationId: actor.organizationId } });
        authorizeProgram(ability, actor, 'update', p);
        const s = await m.save(
          m.create(ProgramSession, {
            organizationId: actor.organizationId,
            programId: p.id,
            date: body.date,
            title: body.title,
            content: body.content,
            status: 'draft',
          }),
        );
        await audit({
          action: 'session.created',
          subjectType: 'ProgramSession',
          subjectId: s.id,
          after: { programId: p.id, date: s.date, title: s.title },
        });
        return (await sessionDtos(m, [s], p.name))[0];
      });
    },
  }),
  orgRoute({
    method: 'put',
    path: '/orgs/:orgId/sessions/:id',
    summary: 'Edit a session; an edit of a published session is checked again and refused if it breaches',
    access: { kind: 'org', action: 'update', subject: 'Program' },
    params: ProgramItemParamsSchema,
    body: SessionUpdateSchema,
    async handler({ ability, actor, user, params, body, tx }) {
      if (body.content) assertUniqueIds(body.content);
      return tx(async (m, audit) => {
        const { session, program } = await loadSessionWithProgram(m, ability, actor, params.id, 'update');
        if (session.version !== body.version) throw versionConflict('session');
        const next = {
          ...session,
          date: body.date ?? session.date,
          title: body.title ?? session.title,
          content: body.content ?? session.content,
        } as ProgramSession;
        if (session.status === 'published')
          refuseBreaches(await checkForAthletes(m, program, [next], user.unitPref, orgToday(actor.timeZone)), 'changed while published');
        await updateVersioned(
          m,
          ProgramSession,
          session.id,
          body.version,
          { date: next.date, title: next.title, content: next.content as never, updatedAt: () => 'now()' },
          'session',
        );
        // A published session that fits again comes off hold.
        if (session.status === 'published') await m.delete(SessionHold, { sessionId: session.id });
        await audit({
          action: 'session.updated',
          subjectType: 'ProgramSession',
          subjectId: session.id,
          before: { date: session.date, title: session.title, content: session.content },
          after: { date: next.date, title: next.title, content: next.content },
        });
        return (await sessionDtos(m, [await m.findOneByOrFail(ProgramSession, { id: session.id })], program.name))[0];
      });
    },
  }),
  orgRoute({
    method: 'delete',
    path: '/orgs/:orgId/sessions/:id',
    summary: 'Delete a session',
    access: { kind: 'org', action: 'update', subject: 'Program' },
    params: ProgramItemParamsSchema,
    async handler({ ability, actor, params, tx }) {
      await tx(async (m, audit) => {
        const { session } = await loadSessionWithProgram(m, ability, actor, params.id, 'update');
        await m.delete(ProgramSession, { id: session.id });
        await audit({
          action: 'session.deleted',
          subjectType: 'ProgramSession',
          subjectId: session.id,
          before: { date: session.date, title: session.title, status: session.status },
        });
      });
      return undefined;
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/sessions/:id/check',
    summary: "Check a session against each athlete's plan without publishing",
    access: { kind: 'org', action: 'read', subject: 'Program' },
    params: ProgramItemParamsSchema,
    async handler({ ds, ability, actor, user, params }) {
      const { session, program } = await loadSessionWithProgram(ds.manager, ability, actor, params.id, 'read');
      return { results: await checkForAthletes(ds.manager, program, [session], user.unitPref, orgToday(actor.timeZone)) };
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/sessions/:id/publish',
    summary: 'Publish a session: refused (422) with the breach list if any set goes past a cap',
    access: { kind: 'org', action: 'update', subject: 'Program' },
    params: ProgramItemParamsSchema,
    body: z.strictObject({ version: VersionSchema }),
    async handler({ ability, actor, user, params, body, tx }) {
      return tx(async (m, audit) => {
        const { session, program } = await loadSessionWithProgram(m, ability, actor, params.id, 'update');
        if (session.version !== body.version) throw versionConflict('session');
        if (session.content.exercises.length === 0)
          throw new AppError('unprocessable', 'An empty session cannot be published: add at least one exercise.');
        const results = await checkForAthletes(m, program, [session], user.unitPref, orgToday(actor.timeZone));
        refuseBreaches(results, 'published');
        await updateVersioned(
          m,
          ProgramSession,
          session.id,
          body.version,
          { status: 'published', publishedAt: () => 'now()', updatedAt: () => 'now()' },
          'session',
        );
        await m.delete(SessionHold, { sessionId: session.id });
        const waived = results.flatMap((r) =>
          r.breaches.filter((b) => b.waived).map((b) => ({ athleteId: r.athleteId, setId: b.setId, rule: b.rule })),
        );
        await audit({
          action: 'session.published',
          subjectType: 'ProgramSession',
          subjectId: session.id,
          athleteId: program.athleteIds.length === 1 ? program.athleteIds[0] : null,
          after: { date: session.date, athletes: program.athleteIds, waivedByException: waived },
        });
        return (await sessionDtos(m, [await m.findOneByOrFail(ProgramSession, { id: session.id })], program.name))[0];
      });
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/sessions/:id/unpublish',
    summary: 'Take a session back to draft',
    access: { kind: 'org', action: 'update', subject: 'Program' },
    params: ProgramItemParamsSchema,
    body: z.strictObject({ version: VersionSchema }),
    async handler({ ability, actor, params, body, tx }) {
      return tx(async (m, audit) => {
        const { session, program } = await loadSessionWithProgram(m, ability, actor, params.id, 'update');
        await updateVersioned(
          m,
          ProgramSession,
          session.id,
          body.version,
          { status: 'draft', publishedAt: null, updatedAt: () => 'now()' },
          'session',
        );
        await m.delete(SessionHold, { sessionId: session.id });
        await audit({ action: 'session.unpublished', subjectType: 'ProgramSession', subjectId: session.id });
        return (await sessionDtos(m, [await m.findOneByOrFail(ProgramSession, { id: session.id })], program.name))[0];
      });
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/programs/:id/copy-week',
    summary: 'Copy the sessions of one week to another week, as drafts',
    access: { kind: 'org', action: 'update', subject: 'Program' },
    params: ProgramItemParamsSchema,
    body: CopyWeekSchema,
    async handler({ ability, actor, params, body, tx }) {
      return tx(async (m, audit) => {
        const p = await m.findOne(Program, { where: { id: params.id, organizationId: actor.organizationId } });
        authorizeProgram(ability, actor, 'update', p);
        const offset = Math.round((Date.parse(body.toWeekStart) - Date.parse(body.fromWeekStart)) / 86_400_000);
        const source = await m
          .createQueryBuilder(ProgramSession, 's')
          .where('s.program_id = :p', { p: p.id })
          .andWhere('s.date >= :from AND s.date < CAST(:from AS date) + 7', { from: body.fromWeekStart })
          .orderBy('s.date')
          .getMany();
        const copies = [];
        for (const s of source) {
          copies.push(
            await m.save(
              m.create(ProgramSession, {
                organizationId: s.organizationId,
                programId: p.id,
                date: shiftDate(s.date, offset),
                title: s.title,
                content: withNewIds(s.content),
                status: 'draft',
              }),
            ),
          );
        }
        await audit({
          action: 'program.week_copied',
          subjectType: 'Program',
          subjectId: p.id,
          after: { ...body, sessions: copies.length },
        });
        return sessionDtos(m, copies, p.name);
      });
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/programs/:id/shift',
    summary: 'Move every draft session from a date on by a number of days',
    access: { kind: 'org', action: 'update', subject: 'Program' },
    params: ProgramItemParamsSchema,
    body: ShiftDatesSchema,
    async handler({ ability, actor, params, body, tx }) {
      return tx(async (m, audit) => {
        const p = await m.findOne(Program, { where: { id: params.id, organizationId: actor.organizationId } });
        authorizeProgram(ability, actor, 'update', p);
        const result = await m
          .createQueryBuilder()
          .update(ProgramSession)
          .set({ date: () => `date + ${Number(body.days)}`, version: () => 'version + 1', updatedAt: () => 'now()' } as never)
          .where(`program_id = :p AND status = 'draft' AND date >= :from`, { p: p.id, from: body.fromDate })
          .execute();
        await audit({
          action: 'program.shifted',
          subjectType: 'Program',
          subjectId: p.id,
          after: { ...body, sessions: result.affected ?? 0 },
        });
        return { moved: result.affected ?? 0, note: 'Only drafts move; published sessions keep their dates.' };
      });
    },
  }),
];
