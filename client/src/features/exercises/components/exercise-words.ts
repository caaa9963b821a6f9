import type { ExerciseDto } from '../../../../../policies/dto';
import { PATTERN_LABELS } from '../../../../../policies/load/patterns';
import type { Equipment } from '../../../../../policies/schemas';
import type { LoadSteps } from '../../../../../policies/load/steps';

export const EQUIPMENT_LABELS: Record<Equipment, string> = {
  barbell: 'Barbell',
  dumbbell: 'Dumbbell',
  kettlebell: 'Kettlebell',
  machine: 'Machine',
  cable: 'Cable',
  bodyweight: 'Bodyweight',
  band: 'Band',
  sled: 'Sled',
  medicine_ball: 'Medicine ball',
  other: 'Other',
};

export function equipmentWords(equipment: string): string {
  return EQUIPMENT_LABELS[equipment as Equipment] ?? equipment;
}

export function stepsWords(steps: LoadSteps): string {
  return steps.kind === 'increment'
    ? `every ${steps.step} ${steps.unit}`
    : `${steps.valuesKg.length} fixed sizes, ${steps.valuesKg.join(', ')} kg`;
}

export function patternsWords(exercise: Pick<ExerciseDto, 'patterns'>): string {
  return exercise.patterns.map((p) => PATTERN_LABELS[p]).join(', ') || '—';
}
