/**
 * The exact (Garwood) Poisson confidence interval for a count, used by the injury report's rates.
 */

/** log(n!) by summing logs, cached (counts here stay in the thousands at most). */
const LOG_FACT: number[] = [0];
function logFactorial(n: number): number {
  for (let i = LOG_FACT.length; i <= n; i++) LOG_FACT[i] = LOG_FACT[i - 1] + Math.log(i);
  return LOG_FACT[n];
}

/** P(X ≤ k) for X ~ Poisson(mean), summed in log space so large means do not underflow. */
export function poissonCdf(k: number, mean: number): number {
  if (k < 0) return 0;
  if (mean <= 0) return 1;
  const logs: number[] = [];
  for (let i = 0; i <= k; i++) logs.push(-mean + i * Math.log(mean) - logFactorial(i));
  const top = Math.max(...logs);
  const sum = logs.reduce((s, l) => s + Math.exp(l - top), 0);
  return Math.min(1, Math.exp(top) * sum);
}

/** Solves f(x) = target for a decreasing f on [0, ∞) by bisection. */
function solveDecreasing(f: (x: number) => number, target: number, hint: number): number {
  let lo = 0;
  let hi = Math.max(1, hint);
  while (f(hi) > target) hi *= 2;
  for (let i = 0; i < 200 && hi - lo > 1e-12 * Math.max(1, hi); i++) {
    const mid = (lo + hi) / 2;
    if (f(mid) > target) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

/**
 * The exact (Garwood 1936) two-sided interval for the mean of a Poisson count k. It is the chi-square
 * form χ²(α/2; 2k)/2 … χ²(1−α/2; 2k+2)/2, worked out here through the identity between the chi-square
 * with even degrees of freedom and the Poisson sum: the lower limit L has P(X ≥ k | L) = α/2 and the
 * upper limit U has P(X ≤ k | U) = α/2.
 */
export function poissonExactInterval(k: number, level = 0.95): { low: number; high: number } {
  if (!Number.isInteger(k) || k < 0) throw new Error(`poissonExactInterval: k must be a whole number ≥ 0, got ${k}`);
  const tail = (1 - level) / 2;
  const high = solveDecreasing((m) => poissonCdf(k, m), tail, k + 10 * Math.sqrt(k + 1) + 10);
  const low = k === 0 ? 0 : solveDecreasing((m) => poissonCdf(k - 1, m), 1 - tail, k);
  return { low, high };
}
