import type { BaselineDto, ExerciseDto } from '../../../../policies/dto';
import { estimateOneRm } from '../../../../policies/load/one-rm';
import {
  BaselineCreateSchema,
  ExerciseCreateSchema,
  ExerciseUpdateSchema,
  OrgItemParamsSchema,
  OrgParamsSchema,
} from '../../../../policies/schemas';
import type { DataSource, EntityManager } from 'typeorm';
import { Baseline, Exercise } from '../../entities';
import { authorize } from '../../core/authorize';
import { AppError } from '../../core/errors';
import { orgRoute, type RouteDef } from '../../http/route';
import { isUniqueViolation } from '../../services/org-members';
import { recheckAthlete } from '../../commands/limits';
import { orgToday } from '../../../../policies/today';
import { updateVersioned } from '../../services/versioned';

export const toExerciseDto = (e: Exercise): ExerciseDto => ({
  id: e.id,
  name: e.name,
  patterns: e.patterns,
  equipment: e.equipment,
  ballistic: e.ballistic,
  steps: e.steps,
  referenceId: e.referenceId,
  archived: e.archived,
  version: e.version,
});

async function baselineList(db: DataSource | EntityManager, athleteId: string): Promise<BaselineDto[]> {
  const rows: (Baseline & { exercise_name: string })[] = await db.query(
    `SELECT b.id, b.athlete_id AS "athleteId", b.exercise_id AS "exerciseId", e.name AS exercise_name, b.kind, b.load_kg AS "loadKg", b.reps, b.rpe,
            b.e1rm_kg AS "e1rmKg", b.formula, b.low_reliability AS "lowReliability", b.tested_on AS "testedOn"
       FROM baselines b JOIN exercises e ON e.id = b.exercise_id WHERE b.athlete_id = $1 ORDER BY b.tested_on DESC, b.created_at DESC LIMIT 500`,
    [athleteId],
  );
  return rows.map((r) => ({
    ...r,
    exerciseName: r.exercise_name,
    loadKg: Number(r.loadKg),
    e1rmKg: Number(r.e1rmKg),
    rpe: r.rpe === null ? null : Number(r.rpe),
  }));
}

async function checkReference(m: EntityManager, organizationId: string, referenceId: string | null | undefined) {
  if (!referenceId) return;
  const ref = await m.findOne(Exercise, { where: { id: referenceId, organizationId } });
  if (!ref)
    throw new AppError('validation_failed', 'Please check the form: referenceId must be an exercise of this library.', {
      referenceId: ['must be an exercise of this library'],
    });
}

export const exerciseRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/exercises',
    summary: "The organization's exercise library",
    access: { kind: 'org', action: 'read', subject: 'Exercise' },
    params: OrgParamsSchema,
    async handler({ ds, actor }) {
      const rows = await ds.getRepository(Exercise).find({ where: { organizationId: actor.organizationId }, order: { name: 'ASC' } });
      return rows.map(toExerciseDto);
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/exercises',
    summary: 'Add an exercise to the library',
    access: { kind: 'org', action: 'create', subject: 'Exercise' },
    params: OrgParamsSchema,
    body: ExerciseCreateSchema,
    status: 201,
    async handler({ ability, actor, body, tx }) {
      authorize(ability, 'create', 'Exercise', { id: '', organizationId: actor.organizationId });
      return tx(async (m, audit) => {
        await checkReference(m, actor.organizationId, body.referenceId);
        try {
          const saved = await m.save(
            m.create(Exercise, { organizationId: actor.organizationId, ...body, referenceId: body.referenceId ?? null }),
          );
          await audit({ action: 'exercise.created', subjectType: 'Exercise', subjectId: saved.id, after: body });
          return toExerciseDto(saved);
        } catch (err) {
          if (isUniqueViolation(err))
            throw new AppError('conflict', `The library already has an exercise named "${body.name}".`, {
              name: ['is already in the library'],
            });
          throw err;
        }
      });
    },
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/exercises/:id',
    summary: 'Edit or archive a library exercise',
    access: { kind: 'org', action: 'update', subject: 'Exercise' },
    params: OrgItemParamsSchema,
    body: ExerciseUpdateSchema,
    async handler({ ability, actor, params, body, tx }) {
      const { version, ...changes } = body;
      return tx(async (m, audit) => {
        const ex = await m.findOne(Exercise, { where: { id: params.id, organizationId: actor.organizationId } });
        authorize(ability, 'update', 'Exercise', ex);
        await checkReference(m, actor.organizationId, changes.referenceId);
        if (changes.referenceId === ex.id)
          throw new AppError('validation_failed', 'Please check the form: referenceId cannot be the exercise itself.', {
            referenceId: ['cannot be the exercise itself'],
          });
        try {
          await updateVersioned(m, Exercise, ex.id, version, changes as Record<string, unknown>, 'exercise');
        } catch (err) {
          // A rename onto another exercise's name hits the unique index: say so, as create does (was a 500).
          if (isUniqueViolation(err))
            throw new AppError('conflict', `The library already has an exercise named "${changes.name}".`, {
              name: ['is already in the library'],
            });
          throw err;
        }
        await audit({
          action: 'exercise.updated',
          subjectType: 'Exercise',
          subjectId: ex.id,
          before: Object.fromEntries(Object.keys(changes).map((k) => [k, ex[k as keyof Exercise]])),
          after: changes,
        });
        return toExerciseDto(await m.findOneByOrFail(Exercise, { id: ex.id }));
      });
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/athletes/:id/baselines',
    summary: "An athlete's strength history: tested maxes, estimates and logged sets",
    access: { kind: 'org', action: 'read', subject: 'Baseline' },
    params: OrgItemParamsSchema,
    async handler({ ds, ability, actor, params }) {
      authorize(ability, 'read', 'Baseline', { organizationId: actor.organizationId, athleteId: params.id });
      return baselineList(ds, params.id);
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/athletes/:id/baselines',
    summary: 'Record a tested 1RM or a set to estimate it from (Epley; RIR-adjusted when an RPE is given)',
    access: { kind: 'org', action: 'create', subject: 'Baseline' },
    params: OrgItemParamsSchema,
    body: BaselineCreateSchema,
    status: 201,
    async handler({ ds, ability, actor, user, params, body, tx }) {
      authorize(ability, 'create', 'Baseline', { organizationId: actor.organizationId, athleteId: params.id });
      await tx(async (m, audit) => {
        const ex = await m.findOne(Exercise, { where: { id: body.exerciseId, organizationId: actor.organizationId } });
        if (!ex)
          throw new AppError('validation_failed', 'Please check the form: exerciseId must be an exercise of this library.', {
            exerciseId: ['must be an exercise of this library'],
          });
        const est =
          body.kind === 'tested'
            ? { value: body.loadKg, lowReliability: false }
            : estimateOneRm(body.loadKg, body.reps, body.rpe ?? null, 'epley');
        if (!est)
          throw new AppError('validation_failed', 'Please check the form: reps cannot give an estimate (too many reps in reserve).', {
            reps: ['gives no usable estimate'],
          });
        const saved = await m.save(
          m.create(Baseline, {
            organizationId: actor.organizationId,
            athleteId: params.id,
            exerciseId: ex.id,
            kind: body.kind,
            loadKg: body.loadKg,
            reps: body.reps,
            rpe: body.rpe ?? null,
            e1rmKg: Math.round(est.value * 100) / 100,
            formula: body.kind === 'tested' ? 'tested' : 'epley',
            lowReliability: est.lowReliability,
            testedOn: body.testedOn,
            createdBy: user.id,
          }),
        );
        await audit({
          action: 'baseline.recorded',
          subjectType: 'Baseline',
          subjectId: saved.id,
          athleteId: params.id,
          after: { exercise: ex.name, ...body, e1rmKg: saved.e1rmKg },
        });
        // A new max changes every %-of-1RM cap: published sessions are checked again.
        await recheckAthlete(m, actor.organizationId, params.id, `A new baseline for ${ex.name} was recorded.`, orgToday(actor.timeZone));
      });
      return (await baselineList(ds, params.id))[0];
    },
  }),
];
