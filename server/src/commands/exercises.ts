import type { ExerciseDto } from '../../../policies/dto';
import type { ExerciseCreateInput, ExerciseUpdateInput } from '../../../policies/schemas/programs';
import { authorize } from '../core/authorize';
import { orgCommand, type OrgCommandCtx } from '../core/command';
import { AppError } from '../core/errors';
import { Exercise } from '../entities';
import { toExerciseDto } from '../queries/exercises';
import { isUniqueViolation } from '../services/org-members';
import { updateVersioned } from '../services/versioned';

async function checkReference(ctx: OrgCommandCtx, referenceId: string | null | undefined) {
  if (!referenceId) return;
  const ref = await ctx.m.findOne(Exercise, { where: { id: referenceId, organizationId: ctx.actor.organizationId } });
  if (!ref)
    throw new AppError('validation_failed', 'Please check the form: referenceId must be an exercise of this library.', {
      referenceId: ['must be an exercise of this library'],
    });
}

/**
 * "Use instead" names exercises of this library, never the exercise itself. An id of another
 * organization's exercise reads as unknown (the same 400 as one that does not exist), so nothing of
 * another library shows through. The team fitting skips archived ones (services/programs.ts engineContext).
 */
async function checkUseInstead(ctx: OrgCommandCtx, ids: readonly string[] | undefined, self?: Pick<Exercise, 'id' | 'useInstead'>) {
  if (!ids || ids.length === 0) return;
  const bad = (message: string) =>
    new AppError('validation_failed', `Please check the form: useInstead ${message}.`, { useInstead: [message] });
  if (self && ids.some((id) => id.toLowerCase() === self.id.toLowerCase())) throw bad('cannot name the exercise itself');
  const found: { id: string; archived: boolean }[] = await ctx.m.query(
    `SELECT id, archived FROM exercises WHERE organization_id = $1 AND id = ANY($2::uuid[])`,
    [ctx.actor.organizationId, ids],
  );
  if (found.length !== new Set(ids.map((id) => id.toLowerCase())).size) throw bad('must name exercises of this library');
  // One archived since it was named may stay (an edit of the name still sends the list); a new one may not.
  const kept = new Set((self?.useInstead ?? []).map((id) => id.toLowerCase()));
  if (found.some((e) => e.archived && !kept.has(e.id))) throw bad('must not name an archived exercise');
}

const nameTaken = (name: string | undefined) =>
  new AppError('conflict', `The library already has an exercise named "${name}".`, { name: ['is already in the library'] });

export const createExercise = orgCommand({
  name: 'exercises.create',
  async run(ctx, input: ExerciseCreateInput): Promise<ExerciseDto> {
    authorize(ctx.ability, 'create', 'Exercise', { id: '', organizationId: ctx.actor.organizationId });
    await checkReference(ctx, input.referenceId);
    await checkUseInstead(ctx, input.useInstead);
    try {
      const saved = await ctx.m.save(
        ctx.m.create(Exercise, { organizationId: ctx.actor.organizationId, ...input, referenceId: input.referenceId ?? null }),
      );
      await ctx.audit({ action: 'exercise.created', subjectType: 'Exercise', subjectId: saved.id, after: input });
      return toExerciseDto(saved);
    } catch (err) {
      if (isUniqueViolation(err)) throw nameTaken(input.name);
      throw err;
    }
  },
});

const samePatterns = (a: readonly string[], b: readonly string[]) => a.length === b.length && [...a].sort().join() === [...b].sort().join();

/** What of the edit decides which sets an athlete may do: the patterns a set counts toward, the impact rules, the 1RM behind a %. */
function limitsWording(before: Exercise, changes: Omit<ExerciseUpdateInput, 'version'>): string[] {
  const what: string[] = [];
  if (changes.patterns !== undefined && !samePatterns(changes.patterns, before.patterns)) what.push('movement patterns');
  if (changes.ballistic !== undefined && changes.ballistic !== before.ballistic) what.push('impact');
  if (changes.referenceId !== undefined && changes.referenceId !== before.referenceId) what.push('reference lift');
  return what;
}

/**
 * Edits, archives or restores a library exercise, writing only the fields sent. An edit of its
 * patterns, impact flag or reference lift changes what every athlete with a published session
 * using it may do, so those sessions are checked again (commands/limits.ts); a rename, new load
 * steps, or archiving (old sessions keep it, with its patterns) change no limit.
 */
export const editExercise = orgCommand({
  name: 'exercises.edit',
  changesLimits: true,
  async run(ctx, input: ExerciseUpdateInput & { id: string }): Promise<ExerciseDto> {
    const { id, version, ...changes } = input;
    const ex = await ctx.m.findOne(Exercise, { where: { id, organizationId: ctx.actor.organizationId } });
    authorize(ctx.ability, 'update', 'Exercise', ex);
    await checkReference(ctx, changes.referenceId);
    await checkUseInstead(ctx, changes.useInstead, ex);
    if (changes.referenceId === ex.id)
      throw new AppError('validation_failed', 'Please check the form: referenceId cannot be the exercise itself.', {
        referenceId: ['cannot be the exercise itself'],
      });
    try {
      await updateVersioned(ctx.m, Exercise, ex.id, version, changes, 'exercise');
    } catch (err) {
      // A rename onto another exercise's name hits the unique index: say so, as create does.
      if (isUniqueViolation(err)) throw nameTaken(changes.name);
      throw err;
    }
    await ctx.audit({
      action: 'exercise.updated',
      subjectType: 'Exercise',
      subjectId: ex.id,
      before: Object.fromEntries(Object.keys(changes).map((k) => [k, ex[k as keyof Exercise]])),
      after: changes,
    });
    const after = await ctx.m.findOneByOrFail(Exercise, { id: ex.id });
    const what = limitsWording(ex, changes);
    if (what.length)
      await ctx.limitsChanged({ exerciseId: ex.id, reason: `The exercise ${after.name} changed in the library (${what.join(', ')}).` });
    else ctx.limitsUnchanged();
    return toExerciseDto(after);
  },
});
