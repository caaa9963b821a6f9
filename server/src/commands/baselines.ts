import type { BaselineDto } from '../../../policies/dto';
import { estimateOneRm } from '../../../policies/load/one-rm';
import type { BaselineCreateInput } from '../../../policies/schemas/programs';
import { authorize } from '../core/authorize';
import { orgCommand } from '../core/command';
import { AppError } from '../core/errors';
import { Baseline, Exercise } from '../entities';
import { baselineDtos } from '../queries/exercises';

/**
 * Records a tested 1RM or a set to estimate it from (Epley; adjusted for reps in reserve when an RPE
 * is given). A new max changes every %-of-1RM cap of the athlete, so their published sessions are
 * checked again (commands/limits.ts).
 */
export const recordBaseline = orgCommand({
  name: 'baselines.record',
  changesLimits: true,
  async run(ctx, input: BaselineCreateInput & { athleteId: string }): Promise<BaselineDto> {
    const { m, actor } = ctx;
    authorize(ctx.ability, 'create', 'Baseline', { organizationId: actor.organizationId, athleteId: input.athleteId });
    const ex = await m.findOne(Exercise, { where: { id: input.exerciseId, organizationId: actor.organizationId } });
    if (!ex)
      throw new AppError('validation_failed', 'Please check the form: exerciseId must be an exercise of this library.', {
        exerciseId: ['must be an exercise of this library'],
      });
    const est =
      input.kind === 'tested'
        ? { value: input.loadKg, lowReliability: false }
        : estimateOneRm(input.loadKg, input.reps, input.rpe ?? null, 'epley');
    if (!est)
      throw new AppError('validation_failed', 'Please check the form: reps cannot give an estimate (too many reps in reserve).', {
        reps: ['gives no usable estimate'],
      });
    const saved = await m.save(
      m.create(Baseline, {
        organizationId: actor.organizationId,
        athleteId: input.athleteId,
        exerciseId: ex.id,
        kind: input.kind,
        loadKg: input.loadKg,
        reps: input.reps,
        rpe: input.rpe ?? null,
        e1rmKg: Math.round(est.value * 100) / 100,
        formula: input.kind === 'tested' ? 'tested' : 'epley',
        lowReliability: est.lowReliability,
        testedOn: input.testedOn,
        createdBy: ctx.userId,
      }),
    );
    const { athleteId, ...entered } = input;
    await ctx.audit({
      action: 'baseline.recorded',
      subjectType: 'Baseline',
      subjectId: saved.id,
      athleteId,
      after: { exercise: ex.name, ...entered, e1rmKg: saved.e1rmKg },
    });
    await ctx.limitsChanged({ athleteIds: [athleteId], reason: `A new baseline for ${ex.name} was recorded.` });
    return (await baselineDtos(m, { athleteId, id: saved.id }))[0];
  },
});
