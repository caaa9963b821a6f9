import { format, parseISO } from 'date-fns';
import type { ExerciseDto, ExceptionDto } from '../../../../../policies/dto';
import { weekOf } from '../../../../../policies/load/compliance';
import { KG_PER_LB } from '../../../../../policies/load/units';
import { PATTERN_LABELS } from '../../../../../policies/load/patterns';

/** '2027-01-05' → 'Tue 5 Jan'. */
export function dayLabel(iso: string): string {
  return format(parseISO(iso), 'EEE d MMM');
}

/** The ISO week (Monday start) a date falls in, named by its Monday: 'Week of Mon 4 Jan 2027'. */
export function weekLabel(monday: string): string {
  return `Week of ${format(parseISO(monday), 'EEE d MMM yyyy')}`;
}

/** Items grouped by the ISO week of their date, weeks in date order. */
export function groupByWeek<T extends { date: string }>(items: T[]): { monday: string; items: T[] }[] {
  const weeks = new Map<string, T[]>();
  for (const item of [...items].sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : 0))) {
    const monday = weekOf(item.date);
    weeks.set(monday, [...(weeks.get(monday) ?? []), item]);
  }
  return [...weeks.entries()].sort(([a], [b]) => (a < b ? -1 : 1)).map(([monday, list]) => ({ monday, items: list }));
}

export function patternWords(exercise: Pick<ExerciseDto, 'patterns'>): string {
  return exercise.patterns.map((p) => PATTERN_LABELS[p]).join(', ') || 'no pattern';
}

const round = (v: number, places = 6) => Math.round(v * 10 ** places) / 10 ** places;

/**
 * The "Use …" fix for a load breach, in the unit of the exercise's own steps, so the number is an
 * exact step (82.5 kg on 2.5 kg steps, 185 lb on 5 lb steps) and never lands a hair over the cap.
 */
export function fixFor(fittingKg: number, exercise: Pick<ExerciseDto, 'steps'> | undefined): { value: number; unit: 'kg' | 'lb' } {
  if (exercise?.steps.kind === 'increment' && exercise.steps.unit === 'lb') return { value: round(fittingKg / KG_PER_LB, 4), unit: 'lb' };
  return { value: round(fittingKg, 4), unit: 'kg' };
}

export const EXCEPTION_WORDS: Record<ExceptionDto['status'], string> = {
  pending: 'Exception requested — waiting for the clinician',
  granted: 'Exception granted',
  refused: 'Exception refused',
};

export function plural(n: number, one: string, many = `${one}s`): string {
  return `${n} ${n === 1 ? one : many}`;
}
