import { isFiniteNumber, LoadInputError, requireInRange } from './guard';

/** The longest session a log may record (24 h), so a session load has an upper bound. */
export const MAX_SESSION_MINUTES = 24 * 60;

/**
 * Training load from session RPE (Foster et al. 2001, JSCR 15:109–115; Foster 1998, MSSE
 * 30:1164–1168): session load = session RPE (CR-10, 0–10) × minutes, in arbitrary units (AU).
 * A LoadInputError when either is not a number or off its scale.
 */
export function sessionLoad(sessionRpe: number, minutes: number): number {
  return requireInRange('session RPE', sessionRpe, 0, 10) * requireInRange('minutes', minutes, 0, MAX_SESSION_MINUTES);
}

/** Daily loads must be finite numbers of 0 or more; anything else is a LoadInputError, never a NaN average. */
function requireLoads(dailyLoads: number[]): void {
  dailyLoads.forEach((v, i) => {
    if (!isFiniteNumber(v) || v < 0)
      throw new LoadInputError(
        `daily load ${i + 1}`,
        isFiniteNumber(v) ? 'out_of_range' : 'not_a_number',
        `daily load ${i + 1} must be a number of 0 or more, got ${String(v)}`,
      );
  });
}

export interface WeekSummary {
  total: number;
  mean: number;
  /** Population standard deviation of the seven daily loads (rest days count as 0). */
  sd: number;
  /** mean / sd; null when every day is the same (sd 0), where monotony is undefined. */
  monotony: number | null;
  /** total × monotony; null when monotony is. */
  strain: number | null;
}

/**
 * Weekly monotony and strain (Foster 1998). We use the population SD (divide by 7): the week is the
 * whole population being described, not a sample of a larger one.
 */
export function weekSummary(dailyLoads: number[]): WeekSummary {
  if (dailyLoads.length !== 7) throw new LoadInputError('daily loads', 'out_of_range', 'weekSummary needs exactly seven daily loads');
  requireLoads(dailyLoads);
  const total = dailyLoads.reduce((a, b) => a + b, 0);
  const mean = total / 7;
  const sd = Math.sqrt(dailyLoads.reduce((a, b) => a + (b - mean) ** 2, 0) / 7);
  const monotony = sd === 0 ? null : mean / sd;
  return { total, mean, sd, monotony, strain: monotony === null ? null : total * monotony };
}

/** λ = 2 / (N + 1) (Williams et al. 2017, BJSM 51:209), for a window of N ≥ 1 days. */
export const ewmaLambda = (n: number) => 2 / (requireInRange('window', n, 1, 3650) + 1);

/** EWMA_t = λ·load_t + (1 − λ)·EWMA_(t−1), over daily loads, starting from `seed`. */
export function ewmaSeries(dailyLoads: number[], n: number, seed = 0): number[] {
  const lambda = ewmaLambda(n);
  requireLoads(dailyLoads);
  let prev = requireInRange('seed', seed, 0, Number.MAX_VALUE);
  const out: number[] = [];
  for (const load of dailyLoads) {
    prev = lambda * load + (1 - lambda) * prev;
    out.push(prev);
  }
  return out;
}

export const ACUTE_DAYS = 7;
export const CHRONIC_DAYS = 28;

export interface AcuteChronic {
  acute: number;
  chronic: number;
  /** acute / chronic; null while there are fewer than 28 days of data or chronic is 0. */
  ratio: number | null;
}

/**
 * Where both averages start. Seeded at 0, a steady load reads as a rise for weeks (28 days at 300 AU
 * give acute 299.90, chronic 259.43, ratio 1.16), because the chronic average is still climbing
 * from nothing. Both are seeded instead with the mean of the first 28 days (all of them when there
 * are fewer) — common practice — so a perfectly steady load reads exactly 1.00 from the first day.
 */
export function acuteChronicSeed(dailyLoads: number[]): number {
  const first = dailyLoads.slice(0, CHRONIC_DAYS);
  return first.length ? first.reduce((a, b) => a + b, 0) / first.length : 0;
}

/**
 * Acute:chronic workload ratio with EWMA (N = 7 and 28; Williams et al. 2017), both averages seeded
 * with `seed` (by default acuteChronicSeed: the mean of the first 28 days). The ratio is hidden for
 * the first 28 days: the chronic average of fewer days describes too little history.
 */
export function acuteChronic(dailyLoads: number[], seed?: number): AcuteChronic {
  requireLoads(dailyLoads);
  const start = seed ?? acuteChronicSeed(dailyLoads);
  const acute = ewmaSeries(dailyLoads, ACUTE_DAYS, start).at(-1) ?? start;
  const chronic = ewmaSeries(dailyLoads, CHRONIC_DAYS, start).at(-1) ?? start;
  const ratio = dailyLoads.length < CHRONIC_DAYS || chronic === 0 ? null : acute / chronic;
  return { acute, chronic, ratio };
}

/** What describeRatio says for a ratio that is not a finite number of 0 or more. */
export const RATIO_CANNOT_COMPUTE = 'The comparison with the recent average cannot be worked out from these logs.';

/**
 * The ratio as a description, never as an injury risk: the bands often quoted (Gabbett 2016) are
 * criticised as mathematically coupled and not predictive (Impellizzeri et al. 2020).
 */
export function describeRatio(ratio: number | null): string {
  if (ratio === null) return 'Not enough training history yet (the comparison needs 28 days of logs).';
  if (!isFiniteNumber(ratio) || ratio < 0) return RATIO_CANNOT_COMPUTE;
  const pct = Math.round((ratio - 1) * 100);
  if (Math.abs(pct) < 5) return 'This week is about the same as the recent average.';
  return pct > 0 ? `This week is ${pct}% above the recent average.` : `This week is ${-pct}% below the recent average.`;
}
