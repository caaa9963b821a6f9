import { z } from 'zod';
import type { DataSource } from 'typeorm';
import type { ExceptionDto } from '../../../../policies/dto';
import type { AppAbility } from '../../../../policies/access';
import {
  ExceptionCreateSchema,
  ExceptionDecisionSchema,
  OrgParamsSchema,
  ProgramItemParamsSchema,
  UuidSchema,
} from '../../../../policies/schemas';
import { Program, ProgramException, ProgramSession } from '../../entities';
import { accessibleWhere } from '../../core/accessible';
import { authorize } from '../../core/authorize';
import { AppError } from '../../core/errors';
import { orgRoute, type RouteDef } from '../../http/route';
import { athleteCircle, notify } from '../../services/notify';
import { recheckAthlete } from '../../commands/limits';
import { orgToday } from '../../../../policies/today';
import { setFingerprint } from '../../services/programs';
import { authorizeProgram } from './program-access';

async function listExceptions(
  ds: DataSource,
  ability: AppAbility,
  organizationId: string,
  where: { id?: string; athleteId?: string; state?: string },
): Promise<ExceptionDto[]> {
  const acl = accessibleWhere(ability, 'read', 'ProgramException', {
    organizationId: 'x.organization_id',
    athleteId: 'x.athlete_id',
    id: 'x.id',
  });
  const qb = ds
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

export const exceptionRoutes: RouteDef[] = [
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/sessions/:id/exceptions',
    summary: 'Ask the clinician for an exception on specific sets of a session for one athlete',
    access: { kind: 'org', action: 'create', subject: 'ProgramException' },
    params: ProgramItemParamsSchema,
    body: ExceptionCreateSchema,
    status: 201,
    async handler({ ds, ability, actor, user, params, body, tx }) {
      const id = await tx(async (m, audit) => {
        const session = await m.findOne(ProgramSession, { where: { id: params.id, organizationId: actor.organizationId } });
        const program = session ? await m.findOne(Program, { where: { id: session.programId } }) : null;
        authorizeProgram(ability, actor, 'update', program);
        if (!program.athleteIds.includes(body.athleteId))
          throw new AppError('validation_failed', 'Please check the form: athleteId is not part of this program.', {
            athleteId: ['is not part of this program'],
          });
        authorize(ability, 'create', 'ProgramException', { id: '', organizationId: actor.organizationId, athleteId: body.athleteId });
        const setIds = new Set(session!.content.exercises.flatMap((e) => e.sets.map((s) => s.id)));
        const unknown = body.setIds.filter((s) => !setIds.has(s));
        if (unknown.length)
          throw new AppError('validation_failed', 'Please check the form: setIds names sets that are not in this session.', {
            setIds: [`${unknown.length} set id(s) are not in this session`],
          });
        const saved = await m.save(
          m.create(ProgramException, {
            organizationId: actor.organizationId,
            sessionId: session!.id,
            athleteId: body.athleteId,
            setIds: body.setIds,
            reason: body.reason,
            requestedBy: user.id,
            status: 'pending',
          }),
        );
        await audit({
          action: 'exception.requested',
          subjectType: 'ProgramException',
          subjectId: saved.id,
          athleteId: body.athleteId,
          after: { sessionId: session!.id, setIds: body.setIds, reason: body.reason },
        });
        const circle = await athleteCircle(m, body.athleteId);
        await notify(m, circle.clinicians, {
          organizationId: actor.organizationId,
          athleteId: body.athleteId,
          kind: 'exception_requested',
          severity: 'routine',
          title: `Exception requested by ${user.displayName}`,
          body: `${user.displayName} asks to go past a cap on ${body.setIds.length} set(s) on ${session!.date} ("${session!.title}"): ${body.reason}`,
        });
        return saved.id;
      });
      return (await listExceptions(ds, ability, actor.organizationId, { id }))[0];
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/exceptions',
    summary: 'Exception requests of my athletes',
    access: { kind: 'org', action: 'read', subject: 'ProgramException' },
    params: OrgParamsSchema,
    query: z.strictObject({
      athleteId: UuidSchema.optional(),
      state: z.enum(['pending', 'all'], { message: 'must be pending or all' }).default('all'),
    }),
    async handler({ ds, ability, actor, query }) {
      return listExceptions(ds, ability, actor.organizationId, query);
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/exceptions/:id/decide',
    summary: 'Grant (optionally for fewer sets) or refuse an exception, with a note — clinicians on the care team only',
    access: { kind: 'org', action: 'update', subject: 'ProgramException' },
    params: ProgramItemParamsSchema,
    body: ExceptionDecisionSchema,
    async handler({ ds, ability, actor, user, params, body, tx }) {
      await tx(async (m, audit) => {
        const x = await m.findOne(ProgramException, { where: { id: params.id, organizationId: actor.organizationId } });
        authorize(ability, 'update', 'ProgramException', x);
        if (x.status !== 'pending') throw new AppError('conflict', `This request was already ${x.status}.`);
        const granted = body.decision === 'grant' ? (body.setIds ?? x.setIds) : [];
        const outside = granted.filter((s) => !x.setIds.includes(s));
        if (outside.length)
          throw new AppError('validation_failed', 'Please check the form: a grant can only narrow the request, not add sets to it.', {
            setIds: ['must be among the requested sets'],
          });
        const session = await m.findOneByOrFail(ProgramSession, { id: x.sessionId });
        const fingerprints: Record<string, string> = {};
        for (const e of session.content.exercises)
          for (const s of e.sets) if (granted.includes(s.id)) fingerprints[s.id] = setFingerprint(e.exerciseId, s, session.date);
        x.status = body.decision === 'grant' ? 'granted' : 'refused';
        x.grantedSetIds = granted;
        x.setFingerprints = fingerprints;
        x.decidedBy = user.id;
        x.decidedAt = new Date();
        x.decisionNote = body.note;
        await m.save(x);
        await audit({
          action: `exception.${x.status}`,
          subjectType: 'ProgramException',
          subjectId: x.id,
          athleteId: x.athleteId,
          before: { status: 'pending', setIds: x.setIds },
          after: { status: x.status, grantedSetIds: granted, note: body.note },
        });
        if (x.status === 'granted')
          await recheckAthlete(m, actor.organizationId, x.athleteId, 'An exception was granted.', orgToday(actor.timeZone));
        if (x.requestedBy) {
          const requester: { id: string }[] = await m.query(`SELECT id FROM memberships WHERE user_id = $1 AND organization_id = $2`, [
            x.requestedBy,
            actor.organizationId,
          ]);
          await notify(
            m,
            requester.map((r) => r.id),
            {
              organizationId: actor.organizationId,
              athleteId: x.athleteId,
              kind: `exception_${x.status}`,
              severity: 'routine',
              title: `Exception ${x.status} by ${user.displayName}`,
              body: `${session.date} "${session.title}": ${x.status === 'granted' ? `granted for ${granted.length} set(s)` : 'refused'}. Note: ${body.note}`,
            },
          );
        }
      });
      return (await listExceptions(ds, ability, actor.organizationId, { id: params.id }))[0];
    },
  }),
];
