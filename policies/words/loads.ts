import type { Unit } from '../schemas/common';
import { formatLoad } from '../load/units';

/**
 * Loads as the trade writes them: "80 kg × 5" (load, then reps), and "3 × (80 kg × 5)" is never
 * needed: several identical sets read "3 sets of 80 kg × 5". One writer for every screen that shows a
 * set, so a coach, a clinician and an athlete read the same line. `loadKg` null or 0 is body weight.
 */
export function loadTimesReps(loadKg: number | null, unit: Unit, reps: number): string {
  const load = loadKg === null || loadKg === 0 ? 'body weight' : formatLoad(loadKg, unit);
  return `${load} × ${reps}`;
}

/** "3 sets of 80 kg × 5", or "80 kg × 5" for one set. */
export function setsOf(count: number, loadKg: number | null, unit: Unit, reps: number): string {
  const line = loadTimesReps(loadKg, unit, reps);
  return count > 1 ? `${count} sets of ${line}` : line;
}
