import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { formatLoad, fromUnit, KG_PER_LB, kgToLb, lbToKg, toUnit } from './units';

describe('pounds and kilograms', () => {
  it('1 lb = 0.45359237 kg exactly (NIST SP 811)', () => {
    expect(KG_PER_LB).toBe(0.45359237);
    expect(lbToKg(1)).toBe(0.45359237);
  });

  it.each([
    // Each recomputed from the NIST factor.
    ['45 lb = 20.41 kg (NIST SP 811)', () => lbToKg(45), 20.41],
    ['135 lb = 61.23 kg (NIST SP 811)', () => lbToKg(135), 61.23],
    ['20 kg = 44.09 lb (NIST SP 811)', () => kgToLb(20), 44.09],
  ])('%s', (_label, compute, expected) => {
    expect(compute()).toBeCloseTo(expected, 2);
  });

  it('a 45 lb bar is not a 20 kg bar (NIST SP 811: 45 lb = 20.41 kg)', () => {
    expect(lbToKg(45)).not.toBeCloseTo(20, 2);
    expect(formatLoad(lbToKg(45), 'kg')).toBe('20.41 kg');
    expect(formatLoad(20, 'lb')).toBe('44.09 lb');
  });

  it('toUnit / fromUnit: kg passes through, lb converts (NIST SP 811)', () => {
    expect(toUnit(61.2, 'kg')).toBe(61.2);
    expect(fromUnit(61.2, 'kg')).toBe(61.2);
    expect(toUnit(20, 'lb')).toBeCloseTo(44.09, 2);
    expect(fromUnit(135, 'lb')).toBeCloseTo(61.23, 2);
  });

  it('formatLoad: two decimals at most, trailing zeros dropped, unit named (common practice)', () => {
    expect(formatLoad(100, 'kg')).toBe('100 kg');
    expect(formatLoad(82.5, 'kg')).toBe('82.5 kg');
    expect(formatLoad(61.234567, 'kg')).toBe('61.23 kg');
    expect(formatLoad(lbToKg(135), 'lb')).toBe('135 lb');
  });

  it('property: converting to a unit and back gives the same kilograms (common practice)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1000, noNaN: true }), fc.constantFrom('kg' as const, 'lb' as const), (kg, unit) => {
        expect(fromUnit(toUnit(kg, unit), unit)).toBeCloseTo(kg, 9);
      }),
    );
  });
});
