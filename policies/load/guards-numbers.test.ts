import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { describeCaps, describeDate, UNKNOWN_DATE } from './describe';
import { isIsoDate, LoadInputError, requireInRange } from './guard';
import { estimateRpe, maxRepsAtPercent, percentForReps } from './intensity';
import { brzycki, epley, estimateOneRm, oneRmProblem } from './one-rm';
import { platesPerSide } from './plates';
import { heaviestPassing, largestFitting, type LoadSteps } from './steps';
import { formatLoad, fromUnit, toUnit, UNKNOWN_LOAD } from './units';
import type { Unit } from '../schemas/common';

// Every pure function answers "cannot compute" (null, a sentence, or a typed LoadInputError) for input that is not a
// number or is off its scale — never NaN or Infinity (common practice: unknown is never a plausible number).
const NOT_NUMBERS = [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY, Number('abc')];
const anyDouble = fc.double();
const kg25: LoadSteps = { kind: 'increment', step: 2.5, unit: 'kg' };

describe('the guard helpers', () => {
  it('requireInRange names the field and the problem', () => {
    expect(requireInRange('x', 3, 0, 10)).toBe(3);
    expect(() => requireInRange('minutes', Number.NaN, 0, 10)).toThrow(LoadInputError);
    try {
      requireInRange('session RPE', 11, 0, 10);
    } catch (e) {
      expect(e).toBeInstanceOf(RangeError);
      expect(e).toMatchObject({ name: 'LoadInputError', field: 'session RPE', problem: 'out_of_range' });
    }
  });

  it('isIsoDate accepts only real calendar days', () => {
    expect(isIsoDate('2028-02-29')).toBe(true);
    for (const bad of ['2026-02-30', '2026-13-01', 'abc', '2026-3-1', '', undefined]) expect(isIsoDate(bad)).toBe(false);
  });
});

describe('reps ↔ %1RM and estimated RPE (NSCA, Baechle & Earle 2008; Zourdos et al. 2016)', () => {
  it('a percent that is not a number, or below 0, has no reps: null', () => {
    for (const v of [...NOT_NUMBERS, -1]) expect(maxRepsAtPercent(v)).toBeNull();
  });

  it('reps that are not a number, below 1, or beyond 112.5 (no load light enough) have no percent: null', () => {
    for (const v of [...NOT_NUMBERS, 0, 0.5, -3, 113]) expect(percentForReps(v)).toBeNull();
  });

  it('an RPE cannot be estimated from a percent or reps it cannot read: null', () => {
    for (const v of NOT_NUMBERS) {
      expect(estimateRpe(v, 5)).toBeNull();
      expect(estimateRpe(80, v)).toBeNull();
    }
    expect(estimateRpe(80, 0)).toBeNull();
    expect(estimateRpe(-5, 5)).toBeNull();
  });

  it('property: for any doubles, each answer is null or a finite number in its range', () => {
    fc.assert(
      fc.property(anyDouble, anyDouble, (a, b) => {
        const reps = maxRepsAtPercent(a);
        const pct = percentForReps(a);
        const rpe = estimateRpe(a, b);
        if (reps !== null) expect(reps >= 1 && reps <= 112.5).toBe(true);
        if (pct !== null) expect(pct >= 0 && pct <= 100).toBe(true);
        if (rpe !== null) expect(rpe >= 1 && rpe <= 10).toBe(true);
      }),
    );
  });
});

describe('estimated 1RM (Epley 1985, from memory; Brzycki 1993, JOPERD 64:88–90)', () => {
  it('the equations answer null for a load or reps they cannot use', () => {
    for (const v of NOT_NUMBERS) {
      expect(epley(v, 5)).toBeNull();
      expect(epley(100, v)).toBeNull();
      expect(brzycki(v, 5)).toBeNull();
    }
    expect(epley(0, 5)).toBeNull();
    expect(epley(100, 0.5)).toBeNull();
  });

  it('RPE 0 or "abc" (as the baseline form reads it) gives no estimate, and a sentence saying why (Zourdos et al. 2016: RPE 1–10)', () => {
    for (const rpe of [0, Number('abc'), 11, -1, Number.POSITIVE_INFINITY]) {
      expect(estimateOneRm(100, 5, rpe)).toBeNull();
      expect(oneRmProblem(100, 5, rpe)).toEqual({
        field: 'rpe',
        message: 'The RPE must be a number from 1 to 10 (or left empty) to estimate the 1RM.',
      });
    }
    expect(oneRmProblem(100, 5, null)).toBeNull();
    expect(oneRmProblem(100, 5, 8)).toBeNull();
  });

  it('each other problem is named: load, reps, too many reps counting reserve (Brzycki 1993), formula', () => {
    expect(oneRmProblem(Number.NaN, 5)?.field).toBe('load');
    expect(oneRmProblem(Number.POSITIVE_INFINITY, 5)?.field).toBe('load');
    expect(oneRmProblem(100, Number.NaN)?.field).toBe('reps');
    expect(oneRmProblem(100, 2.5)?.field).toBe('reps');
    expect(oneRmProblem(100, 30, 3)).toMatchObject({ field: 'reps', message: expect.stringMatching(/past 36 reps.*here 37/) });
    expect(oneRmProblem(100, 5, null, 'mayhew' as never)?.field).toBe('formula');
  });

  it('property: for any doubles an estimate is null or a finite number at least the load', () => {
    fc.assert(
      fc.property(anyDouble, anyDouble, fc.option(anyDouble, { nil: null }), (load, reps, rpe) => {
        const e = estimateOneRm(load, reps, rpe);
        if (e === null) expect(oneRmProblem(load, reps, rpe)).not.toBeNull();
        else expect(Number.isFinite(e.value) && e.value >= load).toBe(true);
      }),
    );
  });
});

describe('plates and steps', () => {
  it('plates for a load that is not a number, negative, over 1000 kg, or in an unknown unit: null, never a throw', () => {
    for (const v of [...NOT_NUMBERS, -5, 1000.5]) expect(platesPerSide(v, 'kg')).toBeNull();
    expect(platesPerSide(2206, 'lb')).toBeNull();
    expect(platesPerSide(100, 'st' as never)).toBeNull();
    expect(platesPerSide(100, 'kg', { bar: Number.NaN })).toBeNull();
    expect(platesPerSide(100, 'kg', { collarsEach: -2.5 })).toBeNull();
    expect(platesPerSide(1000, 'kg')?.shortBy).toBe(0);
  });

  it('a limit that is not a finite number, or steps that cannot be read, fit nothing: null', () => {
    for (const v of NOT_NUMBERS) expect(largestFitting(v, kg25)).toBeNull();
    expect(largestFitting(100, { kind: 'increment', step: 0, unit: 'kg' })).toBeNull();
    expect(largestFitting(100, { kind: 'increment', step: Number.NaN, unit: 'kg' })).toBeNull();
    expect(largestFitting(100, { kind: 'increment', step: 2.5, unit: 'st' as never })).toBeNull();
    expect(largestFitting(30, { kind: 'list', valuesKg: [Number.NaN, 8, Number.POSITIVE_INFINITY, 24] })).toBe(24);
    expect(heaviestPassing(kg25, Number.NaN, () => true)).toBeNull();
  });
});

describe('words for numbers that cannot be shown', () => {
  it('conversions keep "not a number" as NaN (never a plausible 0); an unknown unit is NaN too (NIST SP 811 factor otherwise)', () => {
    expect(toUnit(Number.NaN, 'lb')).toBeNaN();
    expect(fromUnit(Number('abc'), 'kg')).toBeNaN();
    expect(toUnit(100, 'st' as Unit)).toBeNaN();
    expect(fromUnit(100, 'st' as Unit)).toBeNaN();
  });

  it('formatLoad says "an unknown load", never "NaN kg" or "Infinity lb"', () => {
    for (const v of NOT_NUMBERS) {
      expect(formatLoad(v, 'kg')).toBe(UNKNOWN_LOAD);
      expect(formatLoad(v, 'lb', 'down')).toBe(UNKNOWN_LOAD);
    }
    expect(formatLoad(100, 'st' as Unit)).toBe(UNKNOWN_LOAD);
  });

  it('describeDate of something that is not a calendar day says "an unknown date"', () => {
    for (const v of ['abc', '2026-02-30', '']) expect(describeDate(v)).toBe(UNKNOWN_DATE);
  });

  it('a cap that is not a number is said as 0, as the engine reads it (nothing passes it)', () => {
    expect(describeCaps({ maxPercent1RM: Number.NaN, maxLoadKg: Number.POSITIVE_INFINITY, maxRpe: -1 }, 'kg')).toEqual([
      'up to 0% of your best lift',
      'no more than 0 kg',
      'effort RPE 0 or easier',
    ]);
  });

  it('property: no load, for any double, is shown with NaN or Infinity in it', () => {
    fc.assert(
      fc.property(anyDouble, fc.constantFrom<Unit>('kg', 'lb'), (kg, unit) => {
        expect(formatLoad(kg, unit)).not.toMatch(/NaN|Infinity/);
      }),
    );
  });
});
