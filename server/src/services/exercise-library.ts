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
  // Non-impact conditioning: no loaded movement pattern, so no pattern block or cap applies to them.
  ['Bike intervals', [], 'machine', false, kg(2.5)],
  ['Rowing machine intervals', [], 'machine', false, kg(2.5)],
  ['Arm bike intervals', [], 'machine', false, kg(2.5)],
];

/**
 * The starter library's "use instead" relations, in order of preference: what to do when an exercise is
 * not allowed for an athlete. Common practice in return-to-training work (keep the session's intent with
 * less impact or load on the restricted area), not a rule from a published source; each organization
 * edits its copy, and the clinician's limits still decide what is allowed. Names only from DEFAULT_LIBRARY
 * (a test checks it), at most six each, never the exercise itself.
 */
export const DEFAULT_USE_INSTEAD: Record<string, string[]> = {
  'Sprint 20 m': ['Bike intervals', 'Arm bike intervals'],
  'Sled push': ['Bike intervals', 'Arm bike intervals'],
  'Box jump': ['Bike intervals', 'Arm bike intervals'],
  'Broad jump': ['Bike intervals', 'Arm bike intervals'],
  'Bike intervals': ['Arm bike intervals'],
  'Rowing machine intervals': ['Bike intervals', 'Arm bike intervals'],
  'Kettlebell swing': ['Romanian deadlift', 'Hip thrust'],
  'Romanian deadlift': ['Hip thrust'],
  'Power clean': ['Trap-bar deadlift', 'Hip thrust'],
  'Medicine ball rotational throw': ['Pallof press', 'Dead bug'],
  'Pallof press': ['Dead bug'],
  'Medicine ball chest pass': ['Push-up', 'Dumbbell bench press'],
  'Pull-up': ['Lat pulldown'],
};

/**
 * Adds the starter library to an organization (existing names are kept as they are), then its reference
 * lifts and "use instead" relations where the organization has not set them (an exercise missing from
 * the organization's copy is left out of the list).
 */
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
  for (const [name, instead] of Object.entries(DEFAULT_USE_INSTEAD)) {
    await m.query(
      `UPDATE exercises SET use_instead = ARRAY(
          SELECT x.id FROM unnest($3::text[]) WITH ORDINALITY AS n(name, ord)
            JOIN exercises x ON x.organization_id = $1 AND x.name = n.name AND x.name <> $2 ORDER BY n.ord)
        WHERE organization_id = $1 AND name = $2 AND use_instead = '{}'`,
      [organizationId, name, instead],
    );
  }
}
