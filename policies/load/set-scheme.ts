import type { PlannedSetInput } from '../schemas/programs';

/**
 * Quick set entry: "3 × 5 @ 75 %" → three planned sets. Our own small grammar (team programming), shared by
 * the session editor and anything else that takes a scheme. Spaces are allowed between any two tokens and
 * letters may be in any case.
 *
 *   scheme    = group , { ( "," | "+" ) , group } ;
 *   group     = [ count , times ] , reps , "@" , target ;      (* no count: one set *)
 *   times     = "×" | "x" | "X" | "*" ;
 *   target    = load , [ [ "@" ] , rpe ]                       (* "100 kg", "100 kg @ RPE 8", "100 kg RPE 8" *)
 *             | rpe ;                                         (* RPE only: a body-weight set with a target RPE *)
 *   load      = number , ( "%" | "kg" | "lb" | "lbs" ) | "BW" ;
 *   rpe       = "RPE" , number ;
 *   count     = digits ;  reps = digits ;
 *   number    = digits , [ ( "." | "," ) , digits ] ;
 *
 * Examples: "3 × 5 @ 75 %", "4 × 8 @ RPE 7", "3x5@100kg", "5 × 3 @ 225 lb", "3 × 10 @ BW",
 * "1 × 5 @ 60 %, 3 × 5 @ 75 %", "5 @ 80 kg + 3 × 3 @ 90 kg @ RPE 8".
 *
 * Decimals: "." always. "," is a decimal comma only inside a load or RPE number when what follows its
 * digits is not "×" or "@" — then the comma starts a new group, so "4 × 8 @ RPE 7,5 × 3 @ RPE 8" is two
 * groups and "3 × 5 @ 62,5 kg" is 62.5 kg (a count or reps number never takes a decimal comma).
 *
 * An RPE-only set is stored as the session editor stores it: a body-weight load with a target RPE.
 * Bounds are the schemas': 1–30 sets per group and at most 30 in all (one exercise row), reps 1–100,
 * % of 1RM above 0 and at most 110, kg at most 1000, lb at most 2200, RPE 1–10 in half steps.
 * Bad input gives the 0-based character index where it failed and a sentence saying what was expected.
 */

export type SchemeSet = Omit<PlannedSetInput, 'id'>;
export type SchemeResult = { ok: true; sets: SchemeSet[] } | { ok: false; at: number; message: string };

export const MAX_SCHEME_SETS = 30;

const TIMES = new Set(['×', 'x', 'X', '*']);
const isDigit = (c: string | undefined) => c !== undefined && c >= '0' && c <= '9';

class SchemeError extends Error {
  constructor(
    readonly at: number,
    readonly what: string,
  ) {
    super(what);
  }
}

/** Parses a set scheme; never throws. */
export function parseSetScheme(input: string): SchemeResult {
  try {
    return { ok: true, sets: new Parser(String(input ?? '')).scheme() };
  } catch (e) {
    if (!(e instanceof SchemeError)) throw e;
    const before = input.slice(0, e.at).trimStart();
    return { ok: false, at: e.at, message: before.trim() === '' ? e.what : `after "${before}", ${e.what}` };
  }
}

class Parser {
  private i = 0;
  constructor(private readonly s: string) {}

  scheme(): SchemeSet[] {
    const sets: SchemeSet[] = [];
    this.ws();
    if (this.i >= this.s.length) throw new SchemeError(0, 'expected a set scheme such as "3 × 5 @ 75 %"');
    for (;;) {
      const start = this.i;
      const group = this.group();
      if (sets.length + group.length > MAX_SCHEME_SETS)
        throw new SchemeError(start, `expected at most ${MAX_SCHEME_SETS} sets in all (this makes ${sets.length + group.length})`);
      sets.push(...group);
      this.ws();
      if (this.i >= this.s.length) return sets;
      const c = this.s[this.i];
      if (c !== ',' && c !== '+') throw new SchemeError(this.i, 'expected "," or "+" and another group, or the end');
      this.i++;
      this.ws();
    }
  }

  private group(): SchemeSet[] {
    const firstAt = this.i;
    const first = this.whole('the number of sets', ', as in "3 × 5 @ 75 %"');
    this.ws();
    let count = 1;
    let reps = first;
    let repsAt = firstAt;
    if (TIMES.has(this.s[this.i])) {
      this.i++;
      count = first;
      if (count < 1 || count > MAX_SCHEME_SETS) throw new SchemeError(firstAt, `expected from 1 to ${MAX_SCHEME_SETS} sets`);
      this.ws();
      repsAt = this.i;
      reps = this.whole('the number of reps');
      this.ws();
    }
    if (reps < 1 || reps > 100) throw new SchemeError(repsAt, 'expected from 1 to 100 reps');
    if (this.s[this.i] !== '@')
      throw new SchemeError(
        this.i,
        count > 1 || repsAt !== firstAt ? 'expected "@" and a load' : 'expected "×" and the reps, or "@" and a load',
      );
    this.i++;
    this.ws();
    const { load, targetRpe } = this.target();
    return Array.from({ length: count }, () => ({ reps, load: { ...load }, targetRpe }));
  }

  private target(): Pick<SchemeSet, 'load' | 'targetRpe'> {
    if (this.word('rpe')) return { load: { kind: 'bodyweight' }, targetRpe: this.rpe() };
    let load: SchemeSet['load'];
    if (this.word('bw')) load = { kind: 'bodyweight' };
    else {
      const at = this.i;
      const value = this.decimal('expected a load: a number with "%", "kg" or "lb", "BW", or "RPE" and a number');
      this.ws();
      if (this.s[this.i] === '%') {
        this.i++;
        if (!(value > 0 && value <= 110)) throw new SchemeError(at, 'expected a % of 1RM above 0 and at most 110');
        load = { kind: 'percent', value };
      } else if (this.word('kg')) {
        if (value > 1000) throw new SchemeError(at, 'expected at most 1000 kg');
        load = { kind: 'kg', value };
      } else if (this.word('lbs') || this.word('lb')) {
        if (value > 2200) throw new SchemeError(at, 'expected at most 2200 lb');
        load = { kind: 'lb', value };
      } else throw new SchemeError(this.i, 'expected a unit: "%", "kg" or "lb"');
    }
    const back = this.i;
    this.ws();
    if (this.s[this.i] === '@') {
      this.i++;
      this.ws();
      if (!this.word('rpe')) throw new SchemeError(this.i, 'expected "RPE" and a number');
      return { load, targetRpe: this.rpe() };
    }
    if (this.word('rpe')) return { load, targetRpe: this.rpe() };
    this.i = back;
    return { load, targetRpe: null };
  }

  private rpe(): number {
    this.ws();
    const at = this.i;
    const v = this.decimal('expected the RPE, a number from 1 to 10');
    if (!(v >= 1 && v <= 10) || !Number.isInteger(v * 2)) throw new SchemeError(at, 'expected an RPE from 1 to 10 in whole or half steps');
    return v;
  }

  private ws() {
    while (this.i < this.s.length && /\s/.test(this.s[this.i])) this.i++;
  }

  /** A keyword, any case, not running into more letters ("kg" but not "kgs"). */
  private word(w: string): boolean {
    this.ws();
    const end = this.i + w.length;
    if (this.s.slice(this.i, end).toLowerCase() !== w || /[a-z]/i.test(this.s[end] ?? '')) return false;
    this.i = end;
    return true;
  }

  private digits(): string {
    const start = this.i;
    while (isDigit(this.s[this.i])) this.i++;
    return this.s.slice(start, this.i);
  }

  private whole(what: string, hint = ''): number {
    const at = this.i;
    const d = this.digits();
    if (d === '') throw new SchemeError(at, `expected ${what}${hint}`);
    if (this.s[this.i] === '.' || (this.s[this.i] === ',' && isDigit(this.s[this.i + 1]) && !this.commaSeparates()))
      throw new SchemeError(at, `expected ${what} as a whole number`);
    return Number(d);
  }

  /** Whether a "," followed by digits starts a new group: the digits are followed by "×" or "@". */
  private commaSeparates(): boolean {
    let j = this.i + 1;
    while (isDigit(this.s[j])) j++;
    while (j < this.s.length && /\s/.test(this.s[j])) j++;
    return TIMES.has(this.s[j]) || this.s[j] === '@';
  }

  private decimal(expected: string): number {
    const at = this.i;
    const int = this.digits();
    if (int === '') throw new SchemeError(at, expected);
    let text = int;
    const c = this.s[this.i];
    if ((c === '.' || (c === ',' && !this.commaSeparates())) && isDigit(this.s[this.i + 1])) {
      this.i++;
      text += `.${this.digits()}`;
    } else if (c === '.') throw new SchemeError(this.i + 1, 'expected digits after the decimal point');
    return Number(text);
  }
}

const num = (v: number) => String(Number(v.toFixed(6)));

/** One set in the grammar's words: "5 @ 75 %", "8 @ RPE 7", "10 @ BW". */
function target(s: SchemeSet): string {
  const rpe = s.targetRpe != null ? `RPE ${num(s.targetRpe)}` : null;
  const load = s.load;
  if (load.kind === 'bodyweight') return rpe ?? 'BW';
  const words = load.kind === 'percent' ? `${num(load.value)} %` : `${num(load.value)} ${load.kind}`;
  return rpe ? `${words} @ ${rpe}` : words;
}

/** Sets back to a scheme, runs of identical sets grouped: parseSetScheme(formatSetScheme(sets)) gives the same sets. */
export function formatSetScheme(sets: SchemeSet[]): string {
  const groups: { count: number; text: string }[] = [];
  for (const s of sets) {
    const text = `${s.reps} @ ${target(s)}`;
    const last = groups[groups.length - 1];
    if (last && last.text === text) last.count++;
    else groups.push({ count: 1, text });
  }
  return groups.map((g) => `${g.count} × ${g.text}`).join(', ');
}
