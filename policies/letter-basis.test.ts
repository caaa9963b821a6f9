import { describe, expect, it } from 'vitest';
import { letterBasis, sameBasis } from './letter-basis';
import { MOVEMENT_PATTERNS, type MovementPattern, type PatternRule } from './load/patterns';

const free = Object.fromEntries(MOVEMENT_PATTERNS.map((p) => [p, { mode: 'free' }])) as Record<MovementPattern, PatternRule>;
const hinge60 = { ...free, hinge: { mode: 'capped' as const, caps: { maxPercent1RM: 60, maxRpe: 7 } } };

describe('whether a letter still states what is in force', () => {
  it('the same limits, with caps in another order or an empty cap left unset, still match', () => {
    const reordered = { ...free, hinge: { mode: 'capped' as const, caps: { maxRpe: 7, maxPercent1RM: 60, maxLoadKg: undefined } } };
    expect(sameBasis(letterBasis('limited', hinge60), letterBasis('limited', reordered))).toBe(true);
  });

  it('a changed cap, a newly limited movement or a changed status does not', () => {
    const basis = letterBasis('limited', hinge60);
    expect(
      sameBasis(basis, letterBasis('limited', { ...hinge60, hinge: { mode: 'capped', caps: { maxPercent1RM: 50, maxRpe: 7 } } })),
    ).toBe(false);
    expect(sameBasis(basis, letterBasis('limited', { ...hinge60, jump: { mode: 'blocked' } }))).toBe(false);
    expect(sameBasis(basis, letterBasis('full', hinge60))).toBe(false);
    expect(sameBasis(basis, letterBasis('limited', free))).toBe(false);
  });

  it('keeps free movements out of the record: a Full letter rests on no limits', () => {
    expect(letterBasis('full', free)).toEqual({ status: 'full', patterns: {} });
    expect(letterBasis('limited', hinge60).patterns).toEqual({ hinge: { mode: 'capped', caps: { maxPercent1RM: 60, maxRpe: 7 } } });
  });
});
