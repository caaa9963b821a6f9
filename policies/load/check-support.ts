import { isFiniteNumber } from './guard';
import type { EngineSet } from './sets';

/** Small helpers of the compliance check (compliance.ts): number display, memoising, set order, unreadable sets. */

/** A number as the messages show it: at most two decimals, no trailing zeros. */
export const n = (v: number) => String(Number(v.toFixed(2)));

/** A pure function of its argument, remembered for the length of one check (messages repeat the same numbers). */
export function memo<K, V>(fn: (k: K) => V): (k: K) => V {
  const cache = new Map<K, V>();
  return (k) => {
    let v = cache.get(k);
    if (v === undefined && !cache.has(k)) cache.set(k, (v = fn(k)));
    return v as V;
  };
}

export const bySessionThenOrder = (a: EngineSet, b: EngineSet) =>
  a.date < b.date ? -1 : a.date > b.date ? 1 : a.sessionId < b.sessionId ? -1 : a.sessionId > b.sessionId ? 1 : a.order - b.order;

/** Why a set cannot be checked at all, in words; null when every field the check reads is usable. */
export function unreadable(set: EngineSet, validDate: (date: string) => boolean): string | null {
  if (!validDate(set.date)) return 'its date is not a calendar day';
  return unreadableFields(set);
}

/** unreadable for a set whose date is known to be a calendar day: its reps, load and target RPE. */
export function unreadableFields(set: Pick<EngineSet, 'reps' | 'load' | 'targetRpe'>): string | null {
  if (!isFiniteNumber(set.reps) || !Number.isInteger(set.reps) || set.reps < 1) return 'its reps are not a whole number of at least 1';
  if (set.load.kind !== 'bodyweight' && (!isFiniteNumber(set.load.value) || set.load.value < 0)) return 'its load is not a number';
  if (set.targetRpe != null && !(isFiniteNumber(set.targetRpe) && set.targetRpe >= 1 && set.targetRpe <= 10))
    return 'its target RPE is not from 1 to 10';
  return null;
}
