/**
 * Training load from session RPE (Foster et al. 2001, JSCR 15:109–115; Foster 1998, MSSE
 * 30:1164–1168): session load = session RPE (CR-10) × minutes, in arbitrary units (AU).
 */
export function sessionLoad(sessionRpe: number, minutes: number): number {
  return sessionRpe * minutes;
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
  if (dailyLoads.length !== 7) throw new Error('weekSummary needs exactly seven daily loads');
  const total = dailyLoads.reduce((a, b) => a + b, 0);
  const mean = total / 7;
  const sd = Math.sqrt(dailyLoads.reduce((a, b) => a + (b - mean) ** 2, 0) / 7);
  const monotony = sd === 0 ? null : mean / sd;
  return { total, mean, sd, monotony, strain: monotony === null ? null : total * monotony };
}

/** λ = 2 / (N + 1) (Williams et al. 2017, BJSM 51:209). */
export const ewmaLambda = (n: number) => 2 / (n + 1);

/** EWMA_t = λ·load_t + (1 − λ)·EWMA_(t−1), over daily loads, starting from `seed`. */
export function ewmaSeries(dailyLoads: number[], n: number, seed = 0): number[] {
  const lambda = ewmaLambda(n);
  const out: number[] = [];
  let prev = seed;
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
 * Acute:chronic workload ratio with EWMA (N = 7 and 28). Hidden for the first 28 days: seeded at 0,
 * 28 steady days still read 1.16 (REFERENCES section 5), so an early ratio would mislead.
 */
export function acuteChronic(dailyLoads: number[], seed = 0): AcuteChronic {
  const acute = ewmaSeries(dailyLoads, ACUTE_DAYS, seed).at(-1) ?? seed;
  const chronic = ewmaSeries(dailyLoads, CHRONIC_DAYS, seed).at(-1) ?? seed;
  const ratio = dailyLoads.length < CHRONIC_DAYS || chronic === 0 ? null : acute / chronic;
  return { acute, chronic, ratio };
}

/**
 * The ratio as a description, never as an injury risk: the bands often quoted (Gabbett 2016) are
 * criticised as mathematically coupled and not predictive (Impellizzeri et al. 2020).
 */
export function describeRatio(ratio: number | null): string {
  if (ratio === null) return 'Not enough training history yet (the comparison needs 28 days of logs).';
  const pct = Math.round((ratio - 1) * 100);
  if (Math.abs(pct) < 5) return 'This week is about the same as the recent average.';
  return pct > 0 ? `This week is ${pct}% above the recent average.` : `This week is ${-pct}% below the recent average.`;
}
