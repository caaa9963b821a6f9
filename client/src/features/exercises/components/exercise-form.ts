import type { FieldErrors, Resolver } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { ExerciseDto } from '../../../../../policies/dto';
import type { MovementPattern } from '../../../../../policies/load/patterns';
import { KETTLEBELL_KG } from '../../../../../policies/load/steps';
import { ExerciseCreateSchema, type Equipment, type ExerciseCreateInput } from '../../../../../policies/schemas';

/** What the inputs hold; `toPayload` makes the API's shape, which the shared schema then checks. */
export interface ExerciseFormValues {
  name: string;
  patterns: MovementPattern[];
  equipment: Equipment;
  ballistic: 'yes' | 'no';
  stepsKind: 'increment' | 'list';
  step: string;
  stepUnit: 'kg' | 'lb';
  sizes: string[];
  referenceId: string;
  /** Library exercise ids, in order of preference. */
  useInstead: string[];
}

export const BLANK_EXERCISE: ExerciseFormValues = {
  name: '',
  patterns: [],
  equipment: 'barbell',
  ballistic: 'no',
  stepsKind: 'increment',
  step: '2.5',
  stepUnit: 'kg',
  sizes: KETTLEBELL_KG.map(String),
  referenceId: '',
  useInstead: [],
};

export function exerciseToForm(e: ExerciseDto): ExerciseFormValues {
  return {
    name: e.name,
    patterns: e.patterns,
    equipment: e.equipment as Equipment,
    ballistic: e.ballistic ? 'yes' : 'no',
    stepsKind: e.steps.kind,
    step: e.steps.kind === 'increment' ? String(e.steps.step) : '2.5',
    stepUnit: e.steps.kind === 'increment' ? e.steps.unit : 'kg',
    sizes: e.steps.kind === 'list' ? e.steps.valuesKg.map(String) : KETTLEBELL_KG.map(String),
    referenceId: e.referenceId ?? '',
    useInstead: e.useInstead ?? [],
  };
}

export function toPayload(v: ExerciseFormValues): ExerciseCreateInput {
  const step = v.step.trim() === '' ? undefined : Number(v.step.trim().replace(',', '.'));
  return {
    name: v.name,
    patterns: v.patterns,
    equipment: v.equipment,
    ballistic: v.ballistic === 'yes',
    steps:
      v.stepsKind === 'increment'
        ? { kind: 'increment', step: step as number, unit: v.stepUnit }
        : { kind: 'list', valuesKg: v.sizes.map(Number).sort((a, b) => a - b) },
    referenceId: v.referenceId === '' ? null : v.referenceId,
    useInstead: v.useInstead,
  };
}

/** The shared schema on the payload; steps' messages go to the field that shows them. */
export const exerciseFormResolver: Resolver<ExerciseFormValues, unknown, ExerciseCreateInput> = (() => {
  const schema = zodResolver(ExerciseCreateSchema);
  return async (values, context, options) => {
    const result = await schema(toPayload(values) as never, context, options as never);
    const errors = result.errors as Record<string, unknown>;
    const steps = errors.steps as Record<string, unknown> | undefined;
    if (steps) {
      if (steps.step) errors.step = steps.step;
      if (steps.valuesKg) errors.sizes = steps.valuesKg;
      if (!steps.step && !steps.valuesKg) errors.step = steps;
      delete errors.steps;
    }
    if (Object.keys(errors).length > 0) return { values: {}, errors: errors as FieldErrors<ExerciseFormValues> };
    return { values: result.values as ExerciseCreateInput, errors: {} };
  };
})();
