import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { describeSteps, heaviestPassing, KETTLEBELL_KG, largestFitting, type LoadSteps } from './steps';
import { KG_PLATES, LB_PLATES, platesPerSide } from './plates';
import { kgToLb, lbToKg } from './units';

const kettlebells: LoadSteps = { kind: 'list', valuesKg: KETTLEBELL_KG };
const fiveLb: LoadSteps = { kind: 'increment', step: 5, unit: 'lb' };
const twoAndHalfKg: LoadSteps = { kind: 'increment', step: 2.5, unit: 'kg' };
/** A loading the test knows can be worked out (platesPerSide is null only for input it cannot read). */
const loaded = (...args: Parameters<typeof platesPerSide>) => platesPerSide(...args)!;
const sum = (xs: number[]) => xs.reduce((a, b) => a + b, 0);

describe('kettlebell sizes (competition kettlebells, IWF/IKSFA sizes, confirmed only through a reproduction)', () => {
  it('are 8–32 kg in 4 kg increments, and 36–48 kg also', () => {
    const competition = [8, 12, 16, 20, 24, 28, 32];
    expect(KETTLEBELL_KG.slice(0, competition.length)).toEqual(competition);
    expect(KETTLEBELL_KG.slice(competition.length)).toEqual([36, 40, 44, 48]);
  });

  it('a cap picks the heaviest bell at or under it, rounded down never to nearest (common practice)', () => {
    expect(largestFitting(30, kettlebells)).toBe(28); // 32 is nearer to 31, but over 30
    expect(largestFitting(31.9, kettlebells)).toBe(28);
    expect(largestFitting(24, kettlebells)).toBe(24);
    expect(largestFitting(100, kettlebells)).toBe(48);
    expect(largestFitting(7.9, kettlebells)).toBeNull(); // lighter than the lightest bell: nothing fits
    expect(describeSteps(kettlebells)).toBe('the available implements');
  });
});

describe('5 lb increments (NIST SP 811: 1 lb = 0.45359237 kg exactly)', () => {
  it('135 lb = 61.23 kg, and a cap of exactly that fits 135 lb, not 130 lb', () => {
    const cap = lbToKg(135);
    expect(cap).toBeCloseTo(61.23, 2);
    const fit = largestFitting(cap, fiveLb)!;
    expect(kgToLb(fit)).toBeCloseTo(135, 5);
    expect(fit).toBeLessThanOrEqual(cap + 1e-6);
  });

  it('a kg cap between two 5 lb increments takes the lower one: 84 kg (185.19 lb) → 185 lb', () => {
    expect(kgToLb(84)).toBeCloseTo(185.19, 2);
    expect(kgToLb(largestFitting(84, fiveLb)!)).toBeCloseTo(185, 5);
    expect(describeSteps(fiveLb)).toBe('5 lb increments');
  });

  it('every fitting load is a whole number of 5 lb increments, never over the cap, and the next step is (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 2.3, max: 500, noNaN: true }), (capKg) => {
        const fit = largestFitting(capKg, fiveLb);
        expect(fit).not.toBeNull();
        const steps = kgToLb(fit!) / 5;
        expect(Math.abs(steps - Math.round(steps))).toBeLessThan(1e-5);
        expect(fit!).toBeLessThanOrEqual(capKg + 1e-6);
        expect(lbToKg(kgToLb(fit!) + 5)).toBeGreaterThan(capKg - 1e-6);
      }),
    );
  });

  it('below one step, or on a nonsense cap, nothing fits', () => {
    expect(largestFitting(2, fiveLb)).toBeNull(); // 5 lb = 2.27 kg
    expect(largestFitting(0, twoAndHalfKg)).toBeNull();
    expect(largestFitting(-5, twoAndHalfKg)).toBeNull();
    expect(largestFitting(Number.NaN, twoAndHalfKg)).toBeNull();
  });
});

describe('heaviestPassing (the search behind every suggested load)', () => {
  it('a guess only speeds it up: with or without one, right or wrong, the answer is the same (property)', () => {
    const stepsArb = fc.constantFrom<LoadSteps>(kettlebells, fiveLb, twoAndHalfKg);
    fc.assert(
      fc.property(
        stepsArb,
        fc.double({ min: 0, max: 400, noNaN: true }),
        fc.double({ min: -10, max: 500, noNaN: true }),
        (steps, limit, guess) => {
          const ok = (kg: number) => kg <= limit;
          expect(heaviestPassing(steps, 500, ok, guess)).toBe(heaviestPassing(steps, 500, ok));
        },
      ),
    );
  });
});

describe('platesPerSide', () => {
  it('75 kg = 20 kg bar + 25 kg a side + 2.5 kg collars (IWF barbell and disc sizes, confirmed only through a reproduction)', () => {
    expect(loaded(75, 'kg', { collarsEach: 2.5 })).toEqual({ bar: 20, collarsEach: 2.5, perSide: [25], total: 75, shortBy: 0 });
  });

  it('135 lb = 45 lb bar + a 45 lb plate a side (convention)', () => {
    expect(loaded(135, 'lb')).toEqual({ bar: 45, collarsEach: 0, perSide: [45], total: 135, shortBy: 0 });
    expect(loaded(225, 'lb').perSide).toEqual([45, 45]);
  });

  it('a 45 lb bar is not a 20 kg bar: 20.41 kg (NIST SP 811); 20 kg = 44.09 lb', () => {
    const lbBar = loaded(45, 'lb').bar;
    const kgBar = loaded(20, 'kg').bar;
    expect(lbToKg(lbBar)).toBeCloseTo(20.41, 2);
    expect(lbToKg(lbBar)).not.toBeCloseTo(kgBar, 2);
    expect(kgToLb(kgBar)).toBeCloseTo(44.09, 2);
  });

  it('uses IWF discs plus the 1.25 kg fractional plate (common practice), fewest plates first (100 kg = 25 + 15 a side)', () => {
    expect(KG_PLATES).toEqual([25, 20, 15, 10, 5, 2.5, 2, 1.5, 1.25, 1, 0.5]);
    expect(LB_PLATES).toEqual([45, 35, 25, 10, 5, 2.5]);
    expect(loaded(100, 'kg').perSide).toEqual([25, 15]);
    expect(loaded(183, 'kg', { collarsEach: 2.5 }).perSide).toEqual([25, 25, 25, 2.5, 1.5]); // 79 kg a side
  });

  it('makes every 2.5 kg step exactly with the 1.25 kg plate: 82.5 kg = 20 kg bar + 25 + 5 + 1.25 a side', () => {
    expect(loaded(82.5, 'kg')).toEqual({ bar: 20, collarsEach: 0, perSide: [25, 5, 1.25], total: 82.5, shortBy: 0 });
    // Taking the heaviest plate first would fail here (2 + 0.25); the fewest-plates search finds 1.25 + 1.
    expect(loaded(24.5, 'kg').perSide).toEqual([1.25, 1]);
  });

  it('says how much it could not make: 102.6 kg with collars is 102.5 kg, short by 0.1 kg', () => {
    expect(loaded(102.6, 'kg', { collarsEach: 2.5 })).toEqual({
      bar: 20,
      collarsEach: 2.5,
      perSide: [25, 10, 2.5, 1.25],
      total: 102.5,
      shortBy: 0.1,
    });
  });

  it('a target lighter than the bar gets no plates, and the total shows the bar is heavier', () => {
    const r = loaded(15, 'kg');
    expect(r.perSide).toEqual([]);
    expect(r.total).toBe(20);
    expect(r.total).toBeGreaterThan(15);
  });

  it('any kg load on a whole kg above the bar, and any lb load on 5 lb increments, is made exactly, sides equal (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 300 }), fc.boolean(), (k, collars) => {
        const collarsEach = collars ? 2.5 : 0;
        const target = 20 + 2 * collarsEach + k;
        const r = loaded(target, 'kg', { collarsEach });
        expect(r.shortBy).toBe(0);
        expect(r.bar + 2 * r.collarsEach + 2 * sum(r.perSide)).toBeCloseTo(target, 9);
        expect(r.total).toBeCloseTo(target, 9);
      }),
    );
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 120 }), (k) => {
        const r = loaded(45 + 5 * k, 'lb');
        expect(r.shortBy).toBe(0);
        expect(r.total).toBeCloseTo(45 + 5 * k, 9);
      }),
    );
  });
});
