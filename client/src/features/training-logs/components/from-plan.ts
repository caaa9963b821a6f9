import type { TodayDto } from '../../../../../policies/dto';
import { plannedLoadOnTheBarKg } from '../../../../../policies/load/bar-cap';
import { toUnit } from '../../../../../policies/load/units';
import type { Unit } from '../../../../../policies/schemas';
import type { SetRow } from './log-form';

type PlannedSession = Pick<TodayDto['sessions'][number], 'content' | 'loadsKg' | 'exerciseNames'>;

/**
 * The log form's sets from a planned session: every planned set in order, its library exercise,
 * reps, target RPE, and the load in the athlete's unit — as planned when it was planned in that
 * unit, otherwise converted (NIST SP 811) and, read in pounds, rounded down to what goes on the bar
 * (plannedLoadOnTheBarKg: 40 kg is 85 lb, not 88.18). A % of a best lift with no best
 * lift on record, which has no load to show, is left for the athlete to type; body weight is 0.
 */
export function setsFromPlan(session: PlannedSession, unit: Unit): SetRow[] {
  return session.content.exercises.flatMap((e) =>
    e.sets.map((set): SetRow => {
      const kg = session.loadsKg[set.id] ?? null;
      const load =
        set.load.kind === 'bodyweight'
          ? 0
          : set.load.kind === unit
            ? set.load.value
            : kg === null
              ? undefined
              : Number(toUnit(plannedLoadOnTheBarKg(kg, unit), unit).toFixed(2));
      return {
        exercise: session.exerciseNames[e.exerciseId] ?? 'Exercise',
        exerciseId: e.exerciseId,
        load,
        reps: set.reps,
        rpe: set.targetRpe ?? null,
      };
    }),
  );
}
