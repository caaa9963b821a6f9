import { isInRange } from './guard';

/**
 * Plates per side for a barbell load: the fewest plates that make it exactly, else the closest under
 * it. kg: IWF discs 25…0.5 kg (secondary source) plus the 1.25 kg fractional plate most gyms have
 * (common practice), optional 2.5 kg collars; lb: the usual 45…2.5 lb plates (convention). A 45 lb bar
 * is not a 20 kg bar (NIST SP 811: 45 lb = 20.41 kg).
 */
export const KG_PLATES = [25, 20, 15, 10, 5, 2.5, 2, 1.5, 1.25, 1, 0.5];
export const LB_PLATES = [45, 35, 25, 10, 5, 2.5];

export interface PlateLoading {
  bar: number;
  collarsEach: number;
  perSide: number[];
  /** What the bar actually weighs loaded this way. */
  total: number;
  /** Load that could not be made with these plates (the remainder, total across both sides). */
  shortBy: number;
}

/** The heaviest bar load the helper works out: 1000 kg (PlannedLoadSchema's limit), or 2205 lb, about the same. */
export const MAX_PLATE_TARGET = { kg: 1000, lb: 2205 } as const;

/**
 * Null (cannot compute) when the target is not a finite number from 0 to the maximum, the unit is
 * not kg or lb, or the bar or collars are not finite numbers of 0 or more.
 */
export function platesPerSide(target: number, unit: 'kg' | 'lb', opts: { bar?: number; collarsEach?: number } = {}): PlateLoading | null {
  if (unit !== 'kg' && unit !== 'lb') return null;
  if (!isInRange(target, 0, MAX_PLATE_TARGET[unit])) return null;
  const bar = opts.bar ?? (unit === 'kg' ? 20 : 45);
  const collarsEach = opts.collarsEach ?? 0;
  if (!isInRange(bar, 0, MAX_PLATE_TARGET[unit]) || !isInRange(collarsEach, 0, MAX_PLATE_TARGET[unit])) return null;
  const plates = unit === 'kg' ? KG_PLATES : LB_PLATES;
  const side = (target - bar - 2 * collarsEach) / 2;
  const perSide = fewestPlates(side, plates);
  const total = bar + 2 * collarsEach + 2 * perSide.reduce((a, b) => a + b, 0);
  return { bar, collarsEach, perSide, total, shortBy: Math.max(0, Math.round((target - total) * 1000) / 1000) };
}

/**
 * Fewest plates summing exactly to `side` (dynamic programming in quarter units, so 1.25 kg works
 * where taking the heaviest plate first would not), else the heaviest load under it.
 */
function fewestPlates(side: number, plates: number[]): number[] {
  const unit = 0.25;
  const target = Math.floor(side / unit + 1e-9);
  if (target <= 0) return [];
  const coins = plates.map((p) => Math.round(p / unit));
  const best: (number | null)[] = new Array(target + 1).fill(null);
  const pick: number[] = new Array(target + 1).fill(-1);
  best[0] = 0;
  for (let v = 1; v <= target; v++) {
    for (let i = 0; i < coins.length; i++) {
      const prev = v - coins[i];
      if (prev >= 0 && best[prev] !== null && (best[v] === null || best[prev]! + 1 < best[v]!)) {
        best[v] = best[prev]! + 1;
        pick[v] = i;
      }
    }
  }
  let v = target;
  while (v > 0 && best[v] === null) v--;
  const out: number[] = [];
  while (v > 0) {
    out.push(plates[pick[v]]);
    v -= coins[pick[v]];
  }
  return out.sort((a, b) => b - a);
}
