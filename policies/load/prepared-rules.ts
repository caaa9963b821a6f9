import type { EngineContext } from './compliance';
import { exerciseRules, type EngineExercise, type ExerciseRules } from './exercise-rules';
import { isIsoDate } from './guard';
import { inForceOn, type InForce } from './in-force';
import { mondayOf } from './sets';

/** The rules of one combination of stages in force, and what they mean per exercise (worked out on first use). */
export interface StageRules {
  day: InForce;
  exercises: Map<string, ExerciseRules>;
}

/** What the engine reads of one calendar day: the stages in force, whether the athlete is Out, the week's Monday. */
export interface DateRules {
  stages: StageRules;
  out: boolean;
  week: string;
}

/**
 * The rules of one athlete worked out once and kept across checks (team fitting checks each session
 * of a squad's program in rounds, thousands of small checks of the same athlete). Everything kept
 * depends only on the athlete's plans, exercise library and participation status, which a
 * PreparedRules holds by reference: checkSets uses it only for a context with those very same three
 * (the same objects), and otherwise works them out afresh, so a stale one can never be read.
 * Days with the same stage of every plan in force share one InForce (only its date differs, which
 * the check does not read) and one table of exercise rules. The inputs must not be changed in place
 * while a PreparedRules of them is in use (make a new one).
 */
export class PreparedRules {
  readonly plans: EngineContext['plans'];
  readonly exercises: EngineContext['exercises'];
  readonly statusOn: EngineContext['statusOn'];
  private readonly byStages = new Map<string, StageRules>();
  /** Per date string: its rules, or null when it is not a calendar day. */
  private readonly byDate = new Map<string, DateRules | null>();
  private readonly outByDate = new Map<string, boolean>();

  constructor(ctx: Pick<EngineContext, 'plans' | 'exercises' | 'statusOn'>) {
    this.plans = ctx.plans;
    this.exercises = ctx.exercises;
    this.statusOn = ctx.statusOn;
  }

  /** Whether this was prepared from the same plans, library and status as `ctx`. */
  fits(ctx: Pick<EngineContext, 'plans' | 'exercises' | 'statusOn'>): boolean {
    return ctx.plans === this.plans && ctx.exercises === this.exercises && ctx.statusOn === this.statusOn;
  }

  /** The athlete is Out on `date` (statusOn asked once per date). */
  outOn(date: string): boolean {
    let out = this.outByDate.get(date);
    if (out === undefined) this.outByDate.set(date, (out = this.statusOn?.(date) === 'out'));
    return out;
  }

  /** The rules of `date`, or null when it is not a calendar day ('YYYY-MM-DD'). */
  on(date: string): DateRules | null {
    let r = this.byDate.get(date);
    if (r === undefined) {
      const week = mondayOfDay(date);
      r = week === null ? null : { stages: this.stagesOn(date), out: this.outOn(date), week };
      this.byDate.set(date, r);
    }
    return r;
  }

  /** What the rules in force on a day mean for one exercise. */
  rulesFor(stages: StageRules, ex: EngineExercise): ExerciseRules {
    let r = stages.exercises.get(ex.id);
    if (!r) stages.exercises.set(ex.id, (r = exerciseRules(ex, stages.day)));
    return r;
  }

  private stagesOn(date: string): StageRules {
    let key = '';
    for (const plan of this.plans) key += `${plan.stages.findIndex((s) => s.startDate <= date && date <= s.endDate)},`;
    let v = this.byStages.get(key);
    if (!v) this.byStages.set(key, (v = { day: inForceOn(this.plans, date), exercises: new Map() }));
    return v;
  }
}

/**
 * The Monday of a calendar day, or null when the string is not one: isIsoDate and mondayOf, kept per
 * date string (a squad's athletes share the program's dates; the answer depends on the string alone).
 * Bounded: the table is emptied when it grows large.
 */
const mondays = new Map<string, string | null>();
function mondayOfDay(date: string): string | null {
  let m = mondays.get(date);
  if (m === undefined) {
    if (mondays.size >= 4096) mondays.clear();
    mondays.set(date, (m = isIsoDate(date) ? mondayOf(date) : null));
  }
  return m;
}

/** The athlete's rules prepared for many checks (see PreparedRules). */
export const prepareRules = (ctx: Pick<EngineContext, 'plans' | 'exercises' | 'statusOn'>) => new PreparedRules(ctx);
