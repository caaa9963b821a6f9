import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { formatSetScheme, parseSetScheme, type SchemeSet } from './set-scheme';
import { PlannedSetSchema } from '../schemas/programs';

// The quick set entry's grammar (set-scheme.ts header): our own, so the cases below are its specification.
const pct = (value: number) => ({ kind: 'percent' as const, value });
const kg = (value: number) => ({ kind: 'kg' as const, value });
const lb = (value: number) => ({ kind: 'lb' as const, value });
const bw = { kind: 'bodyweight' as const };
const sets = (count: number, reps: number, load: SchemeSet['load'], targetRpe: number | null = null): SchemeSet[] =>
  Array.from({ length: count }, () => ({ reps, load, targetRpe }));

describe('parseSetScheme: valid input', () => {
  it.each<[string, SchemeSet[]]>([
    ['3 × 5 @ 75 %', sets(3, 5, pct(75))],
    ['3 x 5 @ 75%', sets(3, 5, pct(75))],
    ['3X5@75%', sets(3, 5, pct(75))],
    ['3 * 5 @ 75 %', sets(3, 5, pct(75))],
    ['  3 ×5@ 75 %  ', sets(3, 5, pct(75))],
    ['4 × 8 @ RPE 7', sets(4, 8, bw, 7)],
    ['4 × 8 @ rpe 7.5', sets(4, 8, bw, 7.5)],
    ['3x5@100kg', sets(3, 5, kg(100))],
    ['3 × 5 @ 100 KG', sets(3, 5, kg(100))],
    ['5 × 3 @ 225 lb', sets(5, 3, lb(225))],
    ['5 × 3 @ 225 lbs', sets(5, 3, lb(225))],
    ['3 × 10 @ BW', sets(3, 10, bw)],
    ['3 × 10 @ bw', sets(3, 10, bw)],
    ['3 × 10 @ BW @ RPE 6', sets(3, 10, bw, 6)],
    ['3 × 5 @ 100 kg @ RPE 8', sets(3, 5, kg(100), 8)],
    ['3 × 5 @ 100 kg RPE 8.5', sets(3, 5, kg(100), 8.5)],
    ['3 × 5 @ 62.5 kg', sets(3, 5, kg(62.5))],
    ['3 × 5 @ 62,5 kg', sets(3, 5, kg(62.5))],
    ['2 × 6 @ RPE 7,5', sets(2, 6, bw, 7.5)],
    ['5 @ 80 kg', sets(1, 5, kg(80))],
    ['1 × 5 @ 60 %, 3 × 5 @ 75 %', [...sets(1, 5, pct(60)), ...sets(3, 5, pct(75))]],
    ['1 × 5 @ 60 % + 3 × 5 @ 75 %', [...sets(1, 5, pct(60)), ...sets(3, 5, pct(75))]],
    ['1×5@60%,3×5@75%', [...sets(1, 5, pct(60)), ...sets(3, 5, pct(75))]],
    // A comma whose digits run into "×" or "@" starts a new group: RPE 7, then 5 × 3.
    ['4 × 8 @ RPE 7,5 × 3 @ RPE 8', [...sets(4, 8, bw, 7), ...sets(5, 3, bw, 8)]],
    ['2 × 8 @ RPE 7,5 @ 80 kg', [...sets(2, 8, bw, 7), ...sets(1, 5, kg(80))]],
    ['5 @ 80 kg + 3 × 3 @ 90 kg @ RPE 8', [...sets(1, 5, kg(80)), ...sets(3, 3, kg(90), 8)]],
    ['30 × 1 @ 110 %', sets(30, 1, pct(110))],
    ['1 × 100 @ 0 kg', sets(1, 100, kg(0))],
    ['1 × 1 @ 1000 kg', sets(1, 1, kg(1000))],
    ['1 × 1 @ 2200 lb', sets(1, 1, lb(2200))],
    ['1 × 1 @ 0.5 %', sets(1, 1, pct(0.5))],
    ['10 × 1 @ RPE 1 + 20 × 1 @ RPE 10', [...sets(10, 1, bw, 1), ...sets(20, 1, bw, 10)]],
  ])('%s', (input, expected) => {
    const r = parseSetScheme(input);
    expect(r).toEqual({ ok: true, sets: expected });
    // Every set is one the shared schema accepts as it is.
    if (r.ok)
      for (const s of r.sets) expect(PlannedSetSchema.safeParse({ id: '00000000-0000-4000-8000-000000000001', ...s }).success).toBe(true);
  });
});

describe('parseSetScheme: bad input says where it failed', () => {
  it.each<[string, number, string]>([
    ['', 0, 'expected a set scheme such as "3 × 5 @ 75 %"'],
    ['   ', 0, 'expected a set scheme such as "3 × 5 @ 75 %"'],
    ['abc', 0, 'expected the number of sets, as in "3 × 5 @ 75 %"'],
    ['3 × ', 4, 'after "3 × ", expected the number of reps'],
    ['3 × five @ BW', 4, 'after "3 × ", expected the number of reps'],
    ['3 × 5', 5, 'after "3 × 5", expected "@" and a load'],
    ['5', 1, 'after "5", expected "×" and the reps, or "@" and a load'],
    ['3 × 5 @', 7, 'after "3 × 5 @", expected a load: a number with "%", "kg" or "lb", "BW", or "RPE" and a number'],
    ['3 × 5 @ 60', 10, 'after "3 × 5 @ 60", expected a unit: "%", "kg" or "lb"'],
    ['3 × 5 @ 100 kgs', 12, 'after "3 × 5 @ 100 ", expected a unit: "%", "kg" or "lb"'],
    ['3 × 5 @ 60. %', 11, 'after "3 × 5 @ 60.", expected digits after the decimal point'],
    ['3 × 5.5 @ BW', 4, 'after "3 × ", expected the number of reps as a whole number'],
    ['3.5 × 5 @ BW', 0, 'expected the number of sets as a whole number'],
    ['0 × 5 @ BW', 0, 'expected from 1 to 30 sets'],
    ['31 × 5 @ BW', 0, 'expected from 1 to 30 sets'],
    ['3 × 0 @ BW', 4, 'after "3 × ", expected from 1 to 100 reps'],
    ['3 × 101 @ BW', 4, 'after "3 × ", expected from 1 to 100 reps'],
    ['3 × 5 @ 111 %', 8, 'after "3 × 5 @ ", expected a % of 1RM above 0 and at most 110'],
    ['3 × 5 @ 0 %', 8, 'after "3 × 5 @ ", expected a % of 1RM above 0 and at most 110'],
    ['3 × 5 @ 1001 kg', 8, 'after "3 × 5 @ ", expected at most 1000 kg'],
    ['3 × 5 @ 2201 lb', 8, 'after "3 × 5 @ ", expected at most 2200 lb'],
    ['3 × 5 @ RPE 11', 12, 'after "3 × 5 @ RPE ", expected an RPE from 1 to 10 in whole or half steps'],
    ['3 × 5 @ RPE 0.5', 12, 'after "3 × 5 @ RPE ", expected an RPE from 1 to 10 in whole or half steps'],
    ['3 × 5 @ RPE 7.25', 12, 'after "3 × 5 @ RPE ", expected an RPE from 1 to 10 in whole or half steps'],
    ['3 × 5 @ RPE', 11, 'after "3 × 5 @ RPE", expected the RPE, a number from 1 to 10'],
    ['3 × 5 @ 80 kg @ 7', 16, 'after "3 × 5 @ 80 kg @ ", expected "RPE" and a number'],
    ['3 × 5 @ 80 kg 3 × 5 @ 80 kg', 14, 'after "3 × 5 @ 80 kg ", expected "," or "+" and another group, or the end'],
    ['3 × 5 @ 80 kg,', 14, 'after "3 × 5 @ 80 kg,", expected the number of sets, as in "3 × 5 @ 75 %"'],
    ['3 × 5 @ 80 kg; 2 × 5 @ 70 kg', 13, 'after "3 × 5 @ 80 kg", expected "," or "+" and another group, or the end'],
    ['20 × 1 @ BW, 11 × 1 @ BW', 13, 'after "20 × 1 @ BW, ", expected at most 30 sets in all (this makes 31)'],
    ['3 × 5 @ 60,5 × 3 @ 70 %', 10, 'after "3 × 5 @ 60", expected a unit: "%", "kg" or "lb"'],
  ])('%s → at %i', (input, at, message) => {
    expect(parseSetScheme(input)).toEqual({ ok: false, at, message });
  });

  it('never throws, whatever is typed (property)', () => {
    fc.assert(
      fc.property(fc.string({ unit: fc.constantFrom(...'0123456789 ×xX*@%,.+kglbBWRPEr-'.split('')) }), (s) => {
        const r = parseSetScheme(s);
        if (!r.ok) {
          expect(r.at).toBeGreaterThanOrEqual(0);
          expect(r.at).toBeLessThanOrEqual(s.length);
        } else expect(r.sets.length).toBeGreaterThan(0);
      }),
      { numRuns: 2000 },
    );
  });
});

describe('formatSetScheme', () => {
  it('groups runs of identical sets', () => {
    expect(formatSetScheme([...sets(1, 5, pct(60)), ...sets(3, 5, pct(75)), ...sets(2, 8, bw, 7), ...sets(1, 10, bw)])).toBe(
      '1 × 5 @ 60 %, 3 × 5 @ 75 %, 2 × 8 @ RPE 7, 1 × 10 @ BW',
    );
  });

  const loadArb = fc.oneof(
    fc.integer({ min: 1, max: 440 }).map((q) => pct(q / 4)),
    fc.integer({ min: 0, max: 4000 }).map((q) => kg(q / 4)),
    fc.integer({ min: 0, max: 22000 }).map((q) => lb(q / 10)),
    fc.constant(bw),
  );
  const setArb = fc.record({
    reps: fc.integer({ min: 1, max: 100 }),
    load: loadArb,
    targetRpe: fc.option(
      fc.integer({ min: 2, max: 20 }).map((h) => h / 2),
      { nil: null },
    ),
  });
  it('formatting sets back to a scheme and parsing it gives the same sets (property)', () => {
    fc.assert(
      fc.property(fc.array(setArb, { minLength: 1, maxLength: 30 }), (input) => {
        expect(parseSetScheme(formatSetScheme(input))).toEqual({ ok: true, sets: input });
      }),
      { numRuns: 500 },
    );
  });
});
