/**
 * The one way the pure load functions say "cannot compute": a function whose answer can be absent
 * returns null; one whose callers need a number throws this typed error, naming the input and why.
 * Never NaN, never Infinity, never a plausible number made from nonsense.
 */
export type LoadInputProblem = 'not_a_number' | 'out_of_range';

export class LoadInputError extends RangeError {
  readonly field: string;
  readonly problem: LoadInputProblem;
  constructor(field: string, problem: LoadInputProblem, message: string) {
    super(message);
    this.name = 'LoadInputError';
    this.field = field;
    this.problem = problem;
  }
}

/** A real, finite number (not NaN, not ±Infinity, not a numeric string). */
export const isFiniteNumber = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);

/** A finite number from `min` to `max`, both inclusive. */
export const isInRange = (v: unknown, min: number, max: number): v is number => isFiniteNumber(v) && v >= min && v <= max;

/** The value when it is a finite number from `min` to `max`; otherwise a LoadInputError naming `field`. */
export function requireInRange(field: string, v: unknown, min: number, max: number): number {
  if (!isFiniteNumber(v)) throw new LoadInputError(field, 'not_a_number', `${field} must be a number, got ${String(v)}`);
  if (v < min || v > max) throw new LoadInputError(field, 'out_of_range', `${field} must be from ${min} to ${max}, got ${v}`);
  return v;
}

/** 'YYYY-MM-DD' naming a real calendar day. */
export function isIsoDate(v: unknown): v is string {
  if (typeof v !== 'string' || !/^\d{4}-\d{2}-\d{2}$/.test(v)) return false;
  const d = new Date(`${v}T00:00:00Z`);
  return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === v;
}
