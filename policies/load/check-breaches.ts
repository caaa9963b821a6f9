import type { Unit } from '../schemas/common';
import type { Breach, BreachRule } from './breach';
import { memo, n } from './check-support';
import type { ExerciseRules } from './exercise-rules';
import { suggestFit, type Fit } from './fitting';
import type { MovementPattern } from './patterns';
import type { EngineSet } from './sets';
import { describeSteps, type LoadSteps } from './steps';
import { formatLoad } from './units';

/** A breach's words: what was planned, what would fit, the whole sentence. */
export type BreachWords = [planned: string, fits: string | null, message: string];

/**
 * The breaches of one check (compliance.ts) as they are found, and the words they are said in. Kept
 * as methods of one object rather than helpers made afresh for every check: team fitting runs
 * thousands of small checks. `lean` (the fitting's own check, which reads only the rule, the limit
 * and the fitting load) leaves a breach's planned words, fix and message empty when it names a
 * pattern; the rest is exactly what the full check gives.
 */
export class BreachList {
  list: Breach[] = [];
  /** The set being checked, and whether an exception covers it. */
  set!: EngineSet;
  waived = false;
  private fitOf: EngineSet | null = null;
  private fit: Fit | null = null;
  private shows: ((kg: number) => string) | null = null;
  private caps: ((kg: number) => string) | null = null;
  private nums: ((v: number) => string) | null = null;
  /** Checks since the remembered words were last dropped (a reused lean list, see leanBreachList). */
  private uses = 0;

  constructor(
    readonly unit: Unit,
    readonly lean: boolean,
  ) {}

  /** Emptied for the next check; the words remembered (pure functions of a value and the unit) are kept, and dropped every 4,096 checks so they stay few. */
  reset(): void {
    this.list = [];
    this.fitOf = null;
    this.fit = null;
    this.waived = false;
    if (++this.uses < 4096) return;
    this.uses = 0;
    this.shows = this.caps = this.nums = null;
  }

  /** A load in the reader's unit, and a cap rounded down in it (remembered for the length of the check). */
  show(kg: number): string {
    return (this.shows ??= memo((v: number) => formatLoad(v, this.unit)))(kg);
  }
  showCap(kg: number): string {
    return (this.caps ??= memo((v: number) => formatLoad(v, this.unit, 'down')))(kg);
  }
  num(v: number): string {
    return (this.nums ??= memo(n))(v);
  }

  /** A breach of the set being checked; in a lean check the words of a pattern breach are left empty (see `lean`). */
  push(rule: BreachRule, pattern: MovementPattern | null, limit: string, fit: Fit | null, words: BreachWords): void {
    const set = this.set;
    const [planned, fits, message] = this.lean && pattern !== null ? LEAN_WORDS : words;
    this.list.push({
      setId: set.id,
      sessionId: set.sessionId,
      date: set.date,
      exerciseId: set.exerciseId,
      waived: this.waived,
      rule,
      pattern,
      limit,
      planned,
      fits,
      fittingKg: fit?.kg ?? null,
      ...(fit && fit.reps !== set.reps ? { fittingReps: fit.reps } : {}),
      message,
    });
  }

  /** One fit per set, the load that passes all of its load caps, worked out at most once and only when one of them is breached. */
  fitFor(steps: LoadSteps, r: ExerciseRules, oneRm: number | undefined): Fit | null {
    const set = this.set;
    if (this.fitOf !== set) {
      this.fitOf = set;
      this.fit = suggestFit(steps, set.reps, {
        oneRmKg: oneRm,
        pct: r.pct?.value ?? null,
        abs: r.abs?.value ?? null,
        rpe: set.targetRpe == null ? (r.rpe?.value ?? null) : null,
      });
    }
    return this.fit;
  }

  /** The fix in words: the fitting load at these reps (on the steps, or × reps), fewer reps when no load fits, or none. */
  fitWords(f: Fit | null, steps: LoadSteps, form: 'steps' | 'reps'): string | null {
    if (f === null) return null;
    const set = this.set;
    if (f.reps !== set.reps) return `cut to ${f.reps} reps: ${this.show(f.kg)} × ${f.reps} fits`;
    return form === 'steps' ? `${this.show(f.kg)} fits on ${describeSteps(steps)}` : `${this.show(f.kg)} × ${set.reps} fits`;
  }

  fixSentence(f: Fit | null, words: string | null, steps: LoadSteps): string {
    return words === null
      ? 'no load on this exercise fits — choose a lighter one'
      : f!.reps === this.set.reps
        ? words
        : `no load on ${describeSteps(steps)} fits ${this.set.reps} reps — ${words}`;
  }
}

/**
 * The lean list of a unit for the next check, made once and reused (see reset): the fitting runs
 * thousands of small checks one after the other, and the check never calls itself, so one list per
 * unit is enough. The limits it words (a load, a cap, a number) repeat from check to check.
 */
const leanLists = new Map<Unit, BreachList>();
export function leanBreachList(unit: Unit): BreachList {
  let b = leanLists.get(unit);
  if (b === undefined) leanLists.set(unit, (b = new BreachList(unit, true)));
  else b.reset();
  return b;
}

/** The words of a pattern breach in a lean check: none. */
export const LEAN_WORDS: BreachWords = ['', null, ''];
