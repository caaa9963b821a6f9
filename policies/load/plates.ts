/**
 * Plates per side for a barbell load (greedy from the heaviest plate, which is exact for these
 * denominations). kg: IWF discs 25…0.5 kg, optional 2.5 kg collars (secondary source); lb: the usual
 * 45…2.5 lb plates (convention). A 45 lb bar is not a 20 kg bar (NIST SP 811: 45 lb = 20.41 kg).
 */
export const KG_PLATES = [25, 20, 15, 10, 5, 2.5, 2, 1.5, 1, 0.5];
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

export function platesPerSide(target: number, unit: 'kg' | 'lb', opts: { bar?: number; collarsEach?: number } = {}): PlateLoading {
  const bar = opts.bar ?? (unit === 'kg' ? 20 : 45);
  const collarsEach = opts.collarsEach ?? 0;
  const plates = unit === 'kg' ? KG_PLATES : LB_PLATES;
  let side = (target - bar - 2 * collarsEach) / 2;
  const perSide: number[] = [];
  for (const p of plates) {
    while (side >= p - 1e-9) {
      perSide.push(p);
      side = Math.round((side - p) * 1000) / 1000;
    }
  }
  const total = bar + 2 * collarsEach + 2 * perSide.reduce((a, b) => a + b, 0);
  return { bar, collarsEach, perSide, total, shortBy: Math.max(0, Math.round((target - total) * 1000) / 1000) };
}
