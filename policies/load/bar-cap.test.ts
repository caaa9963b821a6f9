import { describe, expect, it } from 'vitest';
import { barStepFor, capOnTheBar, capOnTheBarWords, DEFAULT_BAR_STEP, plannedLoadOnTheBarKg } from './bar-cap';
import { KG_PER_LB } from './units';

/*
 * Every check value was worked by hand from 1 lb = 0.45359237 kg exactly (NIST SP 811; the
 * international yard and pound agreement, 1959), then rounded DOWN to the step.
 */
describe('a cap as a load the athlete can put on the bar (rounded down, never to nearest)', () => {
  it.each([
    // 45 kg / 0.45359237 = 99.208 lb → 19 steps of 5 lb = 95 lb (NIST SP 811; 5-lb steps, common practice).
    [45, 'lb', 5, 95],
    // 20 kg = 44.092 lb → 40 lb (NIST SP 811: 20 kg = 44.09 lb).
    [20, 'lb', 5, 40],
    // 135 lb stored in kg (61.23496995) reads back as exactly 135 lb, not 130 (NIST SP 811: 135 lb = 61.23 kg).
    [135 * KG_PER_LB, 'lb', 5, 135],
    // 60% of a 140 kg 1RM = 84 kg → 82.5 kg on 2.5 kg steps (common practice: under a cap, round down, never to nearest).
    [84, 'kg', 2.5, 82.5],
    // A cap already on a step stays: 80 kg → 80 kg.
    [80, 'kg', 2.5, 80],
    // 84 kg on 1 kg steps (an exercise's own increments) → 84 kg.
    [84, 'kg', 1, 84],
    // 45 kg with 2.5 lb steps: 99.208 lb → 97.5 lb.
    [45, 'lb', 2.5, 97.5],
  ] as const)('%s kg for a %s reader on %s steps → %s', (capKg, unit, step, expected) => {
    expect(capOnTheBar(capKg, unit, step)).toBe(expected);
  });

  it('never shows more than the cap: for every cap from 0 to 200 kg (0.1 kg apart) the load shown converts back to at most the cap', () => {
    for (let i = 0; i <= 2000; i++) {
      const cap = i / 10;
      for (const unit of ['kg', 'lb'] as const) {
        const shown = capOnTheBar(cap, unit)!;
        const backKg = unit === 'kg' ? shown : shown * KG_PER_LB;
        expect(backKg, `${cap} kg in ${unit}`).toBeLessThanOrEqual(cap + 1e-9);
        // …and is the largest such step: one more step would be over it.
        const nextKg = unit === 'kg' ? shown + DEFAULT_BAR_STEP.kg : (shown + DEFAULT_BAR_STEP.lb) * KG_PER_LB;
        expect(nextKg, `${cap} kg in ${unit}`).toBeGreaterThan(cap);
      }
    }
  });

  it('defaults to 2.5 kg and 5 lb steps (common practice: the smallest pair of plates)', () => {
    expect(DEFAULT_BAR_STEP).toEqual({ kg: 2.5, lb: 5 });
    expect(capOnTheBar(45, 'lb')).toBe(95);
    expect(capOnTheBar(84, 'kg')).toBe(82.5);
  });

  it('an unreadable cap, unit or step gives null, never a plausible number', () => {
    expect(capOnTheBar(Number.NaN, 'kg')).toBeNull();
    expect(capOnTheBar(-1, 'kg')).toBeNull();
    expect(capOnTheBar(Number.POSITIVE_INFINITY, 'lb')).toBeNull();
    expect(capOnTheBar(40, 'stone' as never)).toBeNull();
    expect(capOnTheBar(40, 'kg', 0)).toBeNull();
    expect(capOnTheBar(40, 'kg', Number.NaN)).toBeNull();
  });

  it('in words: "up to 95 lb" for 45 kg (NIST SP 811), and a cap under one step is not "up to 0"', () => {
    expect(capOnTheBarWords(45, 'lb')).toBe('up to 95 lb');
    expect(capOnTheBarWords(84, 'kg')).toBe('up to 82.5 kg');
    expect(capOnTheBarWords(2, 'kg')).toBe('less than 2.5 kg — ask your coach what to use');
    expect(capOnTheBarWords(Number.NaN, 'kg')).toMatch(/cannot be read/);
  });
});

describe("the step: the exercise's own increments when they are in the reader's unit", () => {
  it('uses the exercise steps in the same unit, the default otherwise', () => {
    expect(barStepFor({ kind: 'increment', step: 1, unit: 'kg' }, 'kg')).toBe(1);
    expect(barStepFor({ kind: 'increment', step: 2.5, unit: 'lb' }, 'lb')).toBe(2.5);
    expect(barStepFor({ kind: 'increment', step: 5, unit: 'lb' }, 'kg')).toBe(2.5);
    expect(barStepFor({ kind: 'list', valuesKg: [8, 12, 16] }, 'kg')).toBe(2.5);
    expect(barStepFor({ kind: 'increment', step: -1, unit: 'kg' }, 'kg')).toBe(2.5);
    expect(barStepFor(undefined, 'lb')).toBe(5);
  });

  it('a planned load read in pounds is what goes on the bar, rounded down; in kg it is unchanged (1 lb = 0.45359237 kg, NIST SP 811)', () => {
    // 40 kg = 88.185 lb → 85 lb; 12 kg = 26.455 lb → 25 lb; 135 lb stored as kg stays 135 lb.
    expect(plannedLoadOnTheBarKg(40, 'lb') / KG_PER_LB).toBeCloseTo(85, 9);
    expect(plannedLoadOnTheBarKg(12, 'lb') / KG_PER_LB).toBeCloseTo(25, 9);
    expect(plannedLoadOnTheBarKg(135 * KG_PER_LB, 'lb') / KG_PER_LB).toBeCloseTo(135, 9);
    expect(plannedLoadOnTheBarKg(42.5, 'kg')).toBe(42.5);
    for (const kg of [0.5, 3, 17.3, 40, 61.2, 102.06, 250]) expect(plannedLoadOnTheBarKg(kg, 'lb')).toBeLessThanOrEqual(kg);
  });
});
