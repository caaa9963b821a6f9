import { describe, expect, it } from 'vitest';
import { describeCaps, describeDate, describeRule } from './describe';
import { CAP_KEYS, MOVEMENT_PATTERNS, PATTERN_LABELS, type Caps } from './patterns';

describe('describeCaps: caps in plain words for athletes and guardians', () => {
  it('no caps → nothing to say (common practice)', () => {
    expect(describeCaps(undefined, 'kg')).toEqual([]);
    expect(describeCaps({}, 'kg')).toEqual([]);
  });

  it('every kind of cap, in a fixed order (our wording; common practice)', () => {
    const caps: Caps = {
      maxPercent1RM: 60,
      maxLoadKg: 40,
      maxRpe: 7,
      maxSetsPerSession: 4,
      maxRepsPerSet: 8,
      maxHardSetsPerWeek: 10,
      impactAllowed: false,
    };
    expect(describeCaps(caps, 'kg')).toEqual([
      'up to 60% of your best lift',
      'no more than 40 kg',
      'effort RPE 7 or easier',
      'at most 4 sets a session',
      'at most 8 reps a set',
      'at most 10 hard sets a week',
      'no explosive or impact work in this movement (throws, jumps, landings)',
    ]);
  });

  it("a load cap is shown in the reader's unit: 20 kg reads 44.09 lb (NIST SP 811)", () => {
    expect(describeCaps({ maxLoadKg: 20 }, 'lb')).toEqual(['no more than 44.09 lb']);
  });

  it('impact allowed says nothing (it is no limit); a zero hard-set cap is still said', () => {
    expect(describeCaps({ impactAllowed: true }, 'kg')).toEqual([]);
    expect(describeCaps({ maxHardSetsPerWeek: 0 }, 'kg')).toEqual(['at most 0 hard sets a week']);
  });

  it('plain words: no field names or "1RM" jargon reach the reader (common practice)', () => {
    const caps: Caps = {
      maxPercent1RM: 60,
      maxLoadKg: 40,
      maxRpe: 7,
      maxSetsPerSession: 4,
      maxRepsPerSet: 8,
      maxHardSetsPerWeek: 10,
      impactAllowed: false,
    };
    const text = describeCaps(caps, 'lb').join(' ');
    expect(text).not.toMatch(/1RM|undefined|null|NaN/);
    for (const key of CAP_KEYS) expect(text).not.toContain(key);
  });
});

describe('describeRule', () => {
  it("blocked, free and capped each read as a sentence with the pattern's label (our wording; common practice)", () => {
    expect(describeRule('hinge', { mode: 'blocked' }, 'kg')).toBe('Hinge: not allowed for now');
    expect(describeRule('jump', { mode: 'free' }, 'kg')).toBe('Jump / landing: no limits');
    expect(describeRule('squat', { mode: 'capped', caps: { maxPercent1RM: 60, maxRpe: 7 } }, 'kg')).toBe(
      'Squat: up to 60% of your best lift, effort RPE 7 or easier',
    );
  });

  it('capped with nothing to show (only impact allowed) still says care is needed (common practice)', () => {
    expect(describeRule('carry', { mode: 'capped', caps: { impactAllowed: true } }, 'kg')).toBe('Carry: allowed with care');
  });

  it('every pattern has a label, never its code name (common practice)', () => {
    for (const p of MOVEMENT_PATTERNS) {
      const text = describeRule(p, { mode: 'blocked' }, 'kg');
      expect(text.startsWith(`${PATTERN_LABELS[p]}: `)).toBe(true);
      expect(PATTERN_LABELS[p]).not.toMatch(/_/);
    }
  });
});

describe('describeDate', () => {
  it.each([
    ['2026-03-14', '14 March 2026'],
    ['2026-01-01', '1 January 2026'],
    ['2025-12-31', '31 December 2025'],
    ['2024-02-29', '29 February 2024'],
  ])('%s → %s (no time zone moves the day; common practice)', (iso, words) => {
    expect(describeDate(iso)).toBe(words);
  });
});
