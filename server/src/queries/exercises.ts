import type { DataSource, EntityManager } from 'typeorm';
import type { BaselineDto, ExerciseDto } from '../../../policies/dto';
import { authorize } from '../core/authorize';
import { orgQuery } from '../core/command';
import { Exercise } from '../entities';

type Db = DataSource | EntityManager;

export const toExerciseDto = (e: Exercise): ExerciseDto => ({
  id: e.id,
  name: e.name,
  patterns: e.patterns,
  equipment: e.equipment,
  ballistic: e.ballistic,
  steps: e.steps,
  referenceId: e.referenceId,
  useInstead: e.useInstead ?? [],
  archived: e.archived,
  version: e.version,
});

/** The organization's library, archived exercises included (old sessions still name them). */
export const listExercises = orgQuery({
  name: 'exercises.list',
  async run(ctx, _input: void): Promise<ExerciseDto[]> {
    const rows = await ctx.db.getRepository(Exercise).find({ where: { organizationId: ctx.actor.organizationId }, order: { name: 'ASC' } });
    return rows.map(toExerciseDto);
  },
});

/** An athlete's baselines, newest first; `id` picks one. The caller has authorised reading them. */
export async function baselineDtos(db: Db, where: { athleteId: string; id?: string }): Promise<BaselineDto[]> {
  const rows: (BaselineDto & { exercise_name: string })[] = await db.query(
    `SELECT b.id, b.athlete_id AS "athleteId", b.exercise_id AS "exerciseId", e.name AS exercise_name, b.kind, b.load_kg AS "loadKg", b.reps, b.rpe,
            b.e1rm_kg AS "e1rmKg", b.formula, b.low_reliability AS "lowReliability", b.tested_on AS "testedOn"
       FROM baselines b JOIN exercises e ON e.id = b.exercise_id
      WHERE b.athlete_id = $1 AND ($2::uuid IS NULL OR b.id = $2)
      ORDER BY b.tested_on DESC, b.created_at DESC LIMIT 500`,
    [where.athleteId, where.id ?? null],
  );
  return rows.map(({ exercise_name, ...r }) => ({
    ...r,
    exerciseName: exercise_name,
    loadKg: Number(r.loadKg),
    e1rmKg: Number(r.e1rmKg),
    rpe: r.rpe === null ? null : Number(r.rpe),
  }));
}

/** An athlete's strength history: tested maxes, estimates and logged sets. */
export const listBaselines = orgQuery({
  name: 'baselines.list',
  async run(ctx, input: { athleteId: string }): Promise<BaselineDto[]> {
    authorize(ctx.ability, 'read', 'Baseline', { organizationId: ctx.actor.organizationId, athleteId: input.athleteId });
    return baselineDtos(ctx.db, { athleteId: input.athleteId });
  },
});
