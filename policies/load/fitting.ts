import { estimateRpe, percentForReps } from './intensity';
import { heaviestPassing, MAX_LOAD_KG, type LoadSteps } from './steps';

/**
 * What fits under a set's load caps. The engine and its suggestions read a load through the same
 * predicates below, so a suggested load is, by construction, one the engine lets through — the
 * reps ↔ %1RM table is never read one way for the check and another for the suggestion.
 */

/** Floating-point noise is not a breach: a value within this of its cap is at the cap. */
export const CAP_EPS = 1e-9;

export const overCap = (value: number, cap: number) => value > cap + CAP_EPS;

/** %1RM of a load in kg as the engine reads it; null without a usable 1RM. */
export const percentOf = (kg: number, oneRmKg: number | undefined): number | null =>
  oneRmKg !== undefined && oneRmKg > 0 ? (kg / oneRmKg) * 100 : null;

export interface LoadCaps {
  /** The 1RM the exercise is measured against, kg; undefined when there is no usable one. */
  oneRmKg: number | undefined;
  /** The tightest % of 1RM cap, or null. */
  pct: number | null;
  /** The tightest absolute cap in kg, or null. */
  abs: number | null;
  /** The tightest RPE cap, only when the set's RPE is estimated from its load (it has no target RPE). */
  rpe: number | null;
}

/** Whether `kg` lifted for `reps` passes every load cap, read exactly as checkSets reads a planned set. */
export function passesLoadCaps(kg: number, reps: number, caps: LoadCaps): boolean {
  const percent = percentOf(kg, caps.oneRmKg);
  if (caps.pct !== null && (percent === null || overCap(percent, caps.pct))) return false;
  if (caps.abs !== null && overCap(kg, caps.abs)) return false;
  if (caps.rpe !== null) {
    const rpe = percent === null ? null : estimateRpe(percent, reps);
    if (rpe === null || overCap(rpe, caps.rpe)) return false;
  }
  return true;
}

export interface Fit {
  kg: number;
  reps: number;
}

/** The largest whole number in lo + 1 … hi − 1 for which `ok` holds, when `ok` holds for every number below one it holds for; lo when none. */
function lastPassing(lo: number, hi: number, ok: (i: number) => boolean): number {
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2);
    if (ok(mid)) lo = mid;
    else hi = mid;
  }
  return lo;
}

/**
 * The load at the planned reps, else the most reps (fewer reps never make a load harder: the
 * estimated RPE rises with reps) with the load that fits there. Null when nothing fits at one rep.
 */
function atRepsOrFewer(
  reps: number,
  heaviestAt: (r: number) => number | null,
  rpeMatters: boolean,
): { value: number; reps: number } | null {
  const value = heaviestAt(reps);
  if (value !== null) return { value, reps };
  if (!rpeMatters) return null;
  const fewer = lastPassing(0, Math.ceil(reps), (r) => heaviestAt(r) !== null);
  return fewer === 0 ? null : { value: heaviestAt(fewer)!, reps: fewer };
}

/**
 * The heaviest load on the exercise's steps that passes every load cap at the planned reps; when
 * none does and the RPE cap is what stops it (too many reps for the cap at any load), the most reps
 * at which some load fits, with its heaviest load — "cut reps" rather than a load that would still
 * breach. Null when no load fits even at one rep, or the % cap has no 1RM to be read against.
 */
export function suggestFit(steps: LoadSteps, reps: number, caps: LoadCaps): Fit | null {
  let upper = MAX_LOAD_KG;
  if (caps.pct !== null && caps.oneRmKg !== undefined) upper = Math.min(upper, (caps.pct / 100) * caps.oneRmKg);
  if (caps.abs !== null) upper = Math.min(upper, caps.abs);
  const found = atRepsOrFewer(
    reps,
    (r) => heaviestPassing(steps, upper, (kg) => passesLoadCaps(kg, r, caps), likelyKg(r, upper, caps)),
    caps.rpe !== null,
  );
  return found && { kg: found.value, reps: found.reps };
}

/**
 * Where the answer most likely is, so the search usually asks twice: the caps in kg, and for an RPE
 * cap the load on the reps ↔ % line just short of where the estimate rounds up past the cap (the
 * estimate is rounded to half steps, so it stays at the cap until a quarter rep more is needed).
 */
function likelyKg(reps: number, upper: number, caps: LoadCaps): number {
  if (caps.rpe === null || caps.oneRmKg === undefined) return upper;
  const pct = percentForReps(reps + (10 - caps.rpe) - 0.25);
  return pct === null ? 0 : Math.min(upper, (pct / 100) * caps.oneRmKg * (1 - 1e-9));
}

/**
 * For a % of 1RM load with no 1RM to turn it into kg: the heaviest whole percent (within any % cap)
 * at which the estimated RPE stays at or under the cap, with fewer reps when none does at the
 * planned reps. Read through the same estimate as the check.
 */
export function suggestPercent(reps: number, rpeCap: number, pctCap: number | null): { percent: number; reps: number } | null {
  const top = Math.floor(Math.min(110, pctCap ?? 110) + CAP_EPS);
  const passes = (p: number, r: number) => {
    const rpe = estimateRpe(p, r);
    return rpe !== null && !overCap(rpe, rpeCap);
  };
  const found = atRepsOrFewer(reps, (r) => lastPassing(0, top + 1, (p) => passes(p, r)) || null, true);
  return found && { percent: found.value, reps: found.reps };
}
