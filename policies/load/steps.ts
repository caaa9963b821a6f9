import { KG_PER_LB } from './units';

/**
 * The loads an exercise can actually be set to: multiples of an increment (2.5 kg, 5 lb…), or a
 * list of fixed implements (kettlebells 8–48 kg).
 */
export type LoadSteps = { kind: 'increment'; step: number; unit: 'kg' | 'lb' } | { kind: 'list'; valuesKg: number[] };

/** Competition kettlebells, 8–32 kg in 4 kg steps, 36–48 kg also made (IWF/IKSFA sizes, secondary). */
export const KETTLEBELL_KG = [8, 12, 16, 20, 24, 28, 32, 36, 40, 44, 48];

const EPS = 1e-9;

/**
 * The largest load that does not exceed `limitKg` on these steps — rounded down, never to nearest,
 * because under a cap the nearest step can be over it. Null when even the lightest step is over.
 */
export function largestFitting(limitKg: number, steps: LoadSteps): number | null {
  if (!(limitKg >= 0)) return null;
  if (steps.kind === 'list') {
    const fits = steps.valuesKg.filter((v) => v <= limitKg + EPS);
    return fits.length ? Math.max(...fits) : null;
  }
  const stepKg = steps.unit === 'kg' ? steps.step : steps.step * KG_PER_LB;
  const count = Math.floor(limitKg / stepKg + EPS);
  if (count <= 0) return null;
  // Work in the step's own unit so 5 lb steps stay exact multiples of 5 lb.
  return steps.unit === 'kg' ? round6(count * steps.step) : round6(count * steps.step * KG_PER_LB);
}

function round6(v: number) {
  return Math.round(v * 1e6) / 1e6;
}

export function describeSteps(steps: LoadSteps): string {
  return steps.kind === 'list' ? 'the available implements' : `${steps.step} ${steps.unit} steps`;
}
