import type { EntityManager } from 'typeorm';
import type { MovementPattern } from '../../../policies/load/patterns';
import { KETTLEBELL_KG, type LoadSteps } from '../../../policies/load/steps';
import type { Equipment } from '../../../policies/schemas/programs';
import { Exercise } from '../entities';

const kg = (step: number): LoadSteps => ({ kind: 'increment', step, unit: 'kg' });
const kb: LoadSteps = { kind: 'list', valuesKg: KETTLEBELL_KG };

type Entry = [name: string, patterns: MovementPattern[], equipment: Equipment, ballistic: boolean, steps: LoadSteps, reference?: string];

/** Loadline's own starter list; each organization edits its copy. */
export const DEFAULT_LIBRARY: Entry[] = [
  ['Back squat', ['squat'], 'barbell', false, kg(2.5)],
  ['Front squat', ['squat'], 'barbell', false, kg(2.5)],
  ['Goblet squat', ['squat'], 'kettlebell', false, kb],
  ['Box squat', ['squat'], 'barbell', false, kg(2.5), 'Back squat'],
  ['Deadlift', ['hinge'], 'barbell', false, kg(2.5)],
  ['Romanian deadlift', ['hinge'], 'barbell', false, kg(2.5), 'Deadlift'],
  ['Trap-bar deadlift', ['hinge', 'squat'], 'barbell', false, kg(2.5)],
  ['Hip thrust', ['hinge'], 'barbell', false, kg(2.5)],
  ['Kettlebell swing', ['swing', 'hinge'], 'kettlebell', true, kb],
  ['Power clean', ['hinge', 'jump'], 'barbell', true, kg(2.5)],
  ['Split squat', ['lunge'], 'dumbbell', false, kg(2)],
  ['Walking lunge', ['lunge'], 'dumbbell', false, kg(2)],
  ['Step-up', ['lunge'], 'dumbbell', false, kg(2)],
  ['Bench press', ['horizontal_push'], 'barbell', false, kg(2.5)],
  ['Dumbbell bench press', ['horizontal_push'], 'dumbbell', false, kg(2)],
  ['Push-up', ['horizontal_push'], 'bodyweight', false, kg(2.5)],
  ['Overhead press', ['vertical_push'], 'barbell', false, kg(2.5)],
  ['Landmine press', ['vertical_push', 'rotation'], 'barbell', false, kg(2.5)],
  ['Bent-over row', ['horizontal_pull'], 'barbell', false, kg(2.5)],
  ['Single-arm dumbbell row', ['horizontal_pull'], 'dumbbell', false, kg(2)],
  ['Pull-up', ['vertical_pull'], 'bodyweight', false, kg(2.5)],
  ['Lat pulldown', ['vertical_pull'], 'cable', false, kg(5)],
  ['Farmer carry', ['carry'], 'dumbbell', false, kg(2)],
  ['Suitcase carry', ['carry', 'rotation'], 'kettlebell', false, kb],
  ['Pallof press', ['rotation'], 'cable', false, kg(2.5)],
  ['Dead bug', ['rotation'], 'bodyweight', false, kg(2.5)],
  ['Box jump', ['jump'], 'bodyweight', true, kg(2.5)],
  ['Broad jump', ['jump'], 'bodyweight', true, kg(2.5)],
  ['Sprint 20 m', ['sprint'], 'bodyweight', true, kg(2.5)],
  ['Sled push', ['sprint', 'squat'], 'sled', false, kg(5)],
  ['Medicine ball rotational throw', ['throw', 'rotation'], 'medicine_ball', true, kg(1)],
  ['Medicine ball chest pass', ['throw', 'horizontal_push'], 'medicine_ball', true, kg(1)],
];

/** Adds the starter library to an organization (existing names are kept as they are). */
export async function seedExerciseLibrary(m: EntityManager, organizationId: string): Promise<void> {
  await m
    .createQueryBuilder()
    .insert()
    .into(Exercise)
    .values(
      DEFAULT_LIBRARY.map(([name, patterns, equipment, ballistic, steps]) => ({
        organizationId,
        name,
        patterns,
        equipment,
        ballistic,
        steps,
        referenceId: null,
        version: 1,
      })),
    )
    .orIgnore()
    .execute();
  for (const [name, , , , , reference] of DEFAULT_LIBRARY) {
    if (!reference) continue;
    await m.query(
      `UPDATE exercises SET reference_id = (SELECT id FROM exercises WHERE organization_id = $1 AND name = $3)
        WHERE organization_id = $1 AND name = $2 AND reference_id IS NULL`,
      [organizationId, name, reference],
    );
  }
}
