import type { ExceptionDto } from '../../../policies/dto';
import type { ExceptionCreateInput, ExceptionDecisionInput } from '../../../policies/schemas/programs';
import { authorize } from '../core/authorize';
import { orgCommand } from '../core/command';
import { AppError } from '../core/errors';
import { Program, ProgramException, ProgramSession } from '../entities';
import { exceptionDtos } from '../queries/exceptions';
import { memberName } from '../queries/members';
import { athleteCircle, notify } from '../services/notify';
import { authorizeProgram, setFingerprint } from '../services/programs';
import { humanDate } from '../../../policies/words/dates';

/** The coach asks the athlete's clinicians to let named sets of a session go past a cap for one athlete. */
export const requestException = orgCommand({
  name: 'exceptions.request',
  async run(ctx, input: ExceptionCreateInput & { sessionId: string }): Promise<ExceptionDto> {
    const { m, actor } = ctx;
    const session = await m.findOne(ProgramSession, { where: { id: input.sessionId, organizationId: actor.organizationId } });
    const program = session ? await m.findOne(Program, { where: { id: session.programId } }) : null;
    authorizeProgram(ctx.ability, actor, 'update', program);
    if (!program.athleteIds.includes(input.athleteId))
      throw new AppError('validation_failed', 'Please check the form: athleteId is not part of this program.', {
        athleteId: ['is not part of this program'],
      });
    authorize(ctx.ability, 'create', 'ProgramException', { id: '', organizationId: actor.organizationId, athleteId: input.athleteId });
    const setIds = new Set(session!.content.exercises.flatMap((e) => e.sets.map((s) => s.id)));
    const unknown = input.setIds.filter((s) => !setIds.has(s));
    if (unknown.length)
      throw new AppError('validation_failed', 'Please check the form: setIds names sets that are not in this session.', {
        setIds: [`${unknown.length} set id(s) are not in this session`],
      });
    const saved = await m.save(
      m.create(ProgramException, {
        organizationId: actor.organizationId,
        sessionId: session!.id,
        athleteId: input.athleteId,
        setIds: input.setIds,
        reason: input.reason,
        requestedBy: ctx.userId,
        status: 'pending',
      }),
    );
    await ctx.audit({
      action: 'exception.requested',
      subjectType: 'ProgramException',
      subjectId: saved.id,
      athleteId: input.athleteId,
      after: { sessionId: session!.id, setIds: input.setIds, reason: input.reason },
    });
    const me = await memberName(m, actor.membershipId, 'A coach');
    const circle = await athleteCircle(m, input.athleteId);
    await notify(m, circle.clinicians, {
      organizationId: actor.organizationId,
      athleteId: input.athleteId,
      kind: 'exception_requested',
      severity: 'routine',
      title: `Exception requested by ${me}`,
      body: `${me} asks to go past a cap on ${input.setIds.length} set(s) on ${humanDate(session!.date)} ("${session!.title}"): ${input.reason}`,
    });
    return (await exceptionDtos(m, ctx.ability, actor.organizationId, { id: saved.id }))[0];
  },
});

/**
 * A clinician of the athlete grants (the requested sets, or fewer) or refuses. A grant changes what
 * the athlete may do: held sessions whose breaches it waives are released (commands/limits.ts). A
 * refusal changes nothing: the sets stay as blocked as they were.
 */
export const decideException = orgCommand({
  name: 'exceptions.decide',
  changesLimits: true,
  async run(ctx, input: ExceptionDecisionInput & { id: string }): Promise<ExceptionDto> {
    const { m, actor } = ctx;
    const x = await m.findOne(ProgramException, { where: { id: input.id, organizationId: actor.organizationId } });
    authorize(ctx.ability, 'update', 'ProgramException', x);
    if (x.status !== 'pending') throw new AppError('conflict', `This request was already ${x.status}.`);
    const granted = input.decision === 'grant' ? (input.setIds ?? x.setIds) : [];
    const outside = granted.filter((s) => !x.setIds.includes(s));
    if (outside.length)
      throw new AppError('validation_failed', 'Please check the form: a grant can only narrow the request, not add sets to it.', {
        setIds: ['must be among the requested sets'],
      });
    const session = await m.findOneByOrFail(ProgramSession, { id: x.sessionId });
    const fingerprints: Record<string, string> = {};
    for (const e of session.content.exercises)
      for (const s of e.sets) if (granted.includes(s.id)) fingerprints[s.id] = setFingerprint(e.exerciseId, s, session.date);
    x.status = input.decision === 'grant' ? 'granted' : 'refused';
    x.grantedSetIds = granted;
    x.setFingerprints = fingerprints;
    x.decidedBy = ctx.userId;
    x.decidedAt = ctx.now;
    x.decisionNote = input.note;
    await m.save(x);
    await ctx.audit({
      action: `exception.${x.status}`,
      subjectType: 'ProgramException',
      subjectId: x.id,
      athleteId: x.athleteId,
      before: { status: 'pending', setIds: x.setIds },
      after: { status: x.status, grantedSetIds: granted, note: input.note },
    });
    if (x.status === 'granted') await ctx.limitsChanged({ athleteIds: [x.athleteId], reason: 'An exception was granted.' });
    else ctx.limitsUnchanged();
    if (x.requestedBy) {
      const requester: { id: string }[] = await m.query(`SELECT id FROM memberships WHERE user_id = $1 AND organization_id = $2`, [
        x.requestedBy,
        actor.organizationId,
      ]);
      const me = await memberName(m, actor.membershipId, 'A clinician');
      await notify(
        m,
        requester.map((r) => r.id),
        {
          organizationId: actor.organizationId,
          athleteId: x.athleteId,
          kind: `exception_${x.status}`,
          severity: 'routine',
          title: `Exception ${x.status} by ${me}`,
          body: `${humanDate(session.date)} "${session.title}": ${x.status === 'granted' ? `granted for ${granted.length} set(s)` : 'refused'}. Note: ${input.note}`,
        },
      );
    }
    return (await exceptionDtos(m, ctx.ability, actor.organizationId, { id: x.id }))[0];
  },
});
