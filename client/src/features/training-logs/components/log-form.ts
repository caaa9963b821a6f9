import type { FieldErrors, Resolver } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { TrainingLogCreateSchema, type TrainingLogCreateInput, type Unit } from '../../../../../policies/schemas';
import { fromUnit } from '../../../../../policies/load/units';

/** One set as typed: the load in the athlete's own unit. Numbers are undefined until typed. */
export interface SetRow {
  exercise: string;
  /** The library exercise, for a set that comes from a planned session. */
  exerciseId?: string | null;
  load: number | undefined;
  reps: number | undefined;
  rpe: number | null | undefined;
}

export interface LogFormValues {
  athleteId: string;
  date: string;
  durationMinutes: number | undefined;
  sessionRpe: number | undefined;
  painBefore: number | undefined;
  painDuring: number | undefined;
  /** Pain after the session (that evening): optional when logging, asked again on the athlete's page that day. */
  painAfter?: number;
  sets: SetRow[];
  notes?: string;
  /** The planned session this log records ("Log this session"). */
  sessionId?: string;
}

export const EMPTY_SET: SetRow = { exercise: '', load: undefined, reps: undefined, rpe: null };

/** An input's text as a number; '' is "not typed". NaN is left for the schema to refuse in words. */
export const toNumber = (v: unknown) => (typeof v === 'string' ? (v.trim() === '' ? undefined : Number(v)) : v);
export const toNumberOrNull = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? null : toNumber(v));

/** The request body: loads converted to kg with the exact factor (1 lb = 0.45359237 kg, NIST SP 811). */
export function toRequest(values: LogFormValues, unit: Unit): Record<string, unknown> {
  return {
    ...values,
    sets: values.sets.map(({ load, ...set }) => ({
      ...set,
      loadKg: typeof load === 'number' && !Number.isNaN(load) ? fromUnit(load, unit) : load,
    })),
  };
}

/**
 * Validates with the shared TrainingLogCreateSchema — the same one the server runs — on the converted
 * values, then files each set's load message under the field the athlete typed into.
 */
export function logFormResolver(unit: Unit): Resolver<LogFormValues, unknown, TrainingLogCreateInput> {
  const shared = zodResolver(TrainingLogCreateSchema);
  return async (values, context, options) => {
    const result = await shared(toRequest(values, unit) as never, context, options as never);
    const sets = (result.errors as FieldErrors<Record<string, unknown>>).sets as unknown;
    if (Array.isArray(sets)) {
      for (const row of sets as (Record<string, unknown> | undefined)[]) {
        if (row?.loadKg) {
          row.load = row.loadKg;
          delete row.loadKg;
        }
      }
    }
    return result as unknown as Awaited<ReturnType<Resolver<LogFormValues, unknown, TrainingLogCreateInput>>>;
  };
}
