import { describe, expect, it } from 'vitest';
import { CAP_KEYS, MOVEMENT_PATTERNS, PARTICIPATION_STATUSES, type Caps, type CapKey } from './load/patterns';
import { UNITS } from './schemas/common';
import { jargonIn, plainCap, plainLimitLines, plainPainCeiling, plainPatternLimit, plainStatus, PLAIN_PATTERNS } from './plain-words';

/** A few values for each cap kind, at the edges the schema allows (policies/schemas/cases.ts CapsSchema). */
const CAP_VALUES: Record<CapKey, (number | boolean)[]> = {
  maxPercent1RM: [5, 10, 25, 33, 50, 60, 66.67, 75, 80, 99, 100],
  maxLoadKg: [0.5, 20, 61.23, 100, 1000],
  maxRpe: [1, 5, 6, 7, 7.5, 8, 9, 9.5, 10],
  maxSetsPerSession: [1, 3, 50],
  maxRepsPerSet: [1, 8, 100],
  maxHardSetsPerWeek: [0, 1, 6],
  impactAllowed: [false, true],
};

/** Every family text the plain words can make: each pattern blocked, free, and capped with each cap kind and value. */
function everyFamilyText(): string[] {
  const texts: string[] = [];
  for (const unit of UNITS) {
    for (const p of MOVEMENT_PATTERNS) {
      texts.push(plainPatternLimit(p, { mode: 'blocked' }, unit), plainPatternLimit(p, { mode: 'free' }, unit));
      for (const key of CAP_KEYS) {
        for (const v of CAP_VALUES[key]) texts.push(plainPatternLimit(p, { mode: 'capped', caps: { [key]: v } as Caps }, unit));
      }
    }
    texts.push(...plainLimitLines({ patterns: { hinge: { mode: 'blocked' } }, painCeiling: 3 }, unit));
  }
  for (const s of PARTICIPATION_STATUSES) texts.push(plainStatus(s));
  for (let c = 0; c <= 10; c++) texts.push(plainPainCeiling(c));
  return texts;
}

describe('plain words for families (everyone hears every change, in their own words)', () => {
  it('common practice: no family text holds a word of the trade (hinge, RPE, 1RM, rotation, sets, reps, %, …)', () => {
    const texts = everyFamilyText();
    expect(texts.length).toBeGreaterThan(MOVEMENT_PATTERNS.length * CAP_KEYS.length * 2);
    const offending = texts.map((t) => [t, jargonIn(t)] as const).filter(([, found]) => found.length > 0);
    expect(offending).toEqual([]);
  });

  it('the jargon check itself finds whole words, any case, and the percent sign', () => {
    expect(jargonIn('Hinge: up to 60% of estimated 1RM, effort RPE 7')).toEqual(
      expect.arrayContaining(['hinge', 'RPE', '1RM', '%', 'estimated']),
    );
    expect(jargonIn('Rotation / anti-rotation: 3 sets of 5 reps')).toEqual(
      expect.arrayContaining(['rotation', 'anti-rotation', 'sets', 'reps']),
    );
    // Words that only contain a jargon word are everyday words: "Loadline", "representative", "settle".
    expect(jargonIn('Loadline: a representative will settle it, the clinician set out what is allowed')).toEqual([]);
  });

  it('every pattern has its own words, and the blocked hinge reads in the plain words the product sets for it', () => {
    for (const p of MOVEMENT_PATTERNS) expect(PLAIN_PATTERNS[p].activity.length).toBeGreaterThan(5);
    expect(plainPatternLimit('hinge', { mode: 'blocked' }, 'kg')).toBe(
      'No lifting heavy things from the floor or bending forward with weight.',
    );
    expect(plainPatternLimit('throw', { mode: 'free' }, 'kg')).toBe('Throwing: no limit.');
  });

  it('Zourdos et al. 2016 (RPE = 10 − reps in reserve): RPE 6 → "able to do 4 more"; a half step reads as the stricter whole one', () => {
    expect(plainCap('maxRpe', 6, 'kg')).toBe('keep it at a comfortable effort, able to do 4 more');
    expect(plainCap('maxRpe', 8, 'kg')).toBe('keep it at a moderate effort, able to do 2 more');
    // RPE 7.5 = 2.5 in reserve: "3 more" never allows more effort than the cap.
    expect(plainCap('maxRpe', 7.5, 'kg')).toBe('keep it at a moderate effort, able to do 3 more');
    expect(plainCap('maxRpe', 10, 'kg')).toBe('hard efforts are allowed, up to the most that can be done');
  });

  it('NIST SP 811 (1 lb = 0.45359237 kg): a weight cap in the family’s unit, rounded down to a load on the bar — 20 kg = 44.09 lb → 40 lb', () => {
    // Steps of 2.5 kg / 5 lb (common practice: the smallest common plate pair), never rounded up past the cap.
    expect(plainCap('maxLoadKg', 20, 'kg')).toBe('nothing heavier than 20 kg');
    expect(plainCap('maxLoadKg', 20, 'lb')).toBe('nothing heavier than 40 lb');
    // 61.23 kg ≈ 134.99 lb (135 lb = 61.23 kg, NIST SP 811): rounded down, never up to 135.
    expect(plainCap('maxLoadKg', 61.23, 'lb')).toBe('nothing heavier than 130 lb');
  });

  it('common practice: a share of the heaviest single lift said as a common fraction, rounded down', () => {
    expect(plainCap('maxPercent1RM', 60, 'kg')).toBe('weights no heavier than three fifths of the most that can be lifted once');
    expect(plainCap('maxPercent1RM', 50, 'kg')).toBe('weights no heavier than half of the most that can be lifted once');
    expect(plainCap('maxPercent1RM', 74, 'kg')).toBe('weights no heavier than seven tenths of the most that can be lifted once');
    expect(plainCap('maxPercent1RM', 66.67, 'kg')).toBe('weights no heavier than two thirds of the most that can be lifted once');
    expect(plainCap('maxPercent1RM', 5, 'kg')).toBe('only very light weights, well under a tenth of the most that can be lifted once');
  });

  it('a stage reads limited movements in order, then everything else, then the pain ceiling (Silbernagel et al. 2007 scale 0–10)', () => {
    const lines = plainLimitLines(
      {
        painCeiling: 3,
        patterns: {
          squat: { mode: 'capped', caps: { maxLoadKg: 40, maxRepsPerSet: 8, impactAllowed: false } },
          hinge: { mode: 'blocked' },
          jump: { mode: 'free' },
        },
      },
      'kg',
    );
    expect(lines).toEqual([
      'No lifting heavy things from the floor or bending forward with weight.',
      'Squatting down and standing back up with weight: nothing heavier than 40 kg; at most 8 in a row before a rest; nothing fast or jarring while doing it (no throwing, jumping or landing with it).',
      'Everything else: no limit.',
      'Stop and tell the clinician if pain during training goes above 3 out of 10.',
    ]);
    expect(plainLimitLines({ patterns: {}, painCeiling: 5 }, 'kg')[0]).toBe('No limit on any kind of movement.');
  });

  it('a cap that cannot be read is said as less than one step, as the engine reads it (nothing passes)', () => {
    expect(plainCap('maxLoadKg', Number.NaN, 'kg')).toBe('less than 2.5 kg — ask your coach what to use');
    expect(plainCap('maxSetsPerSession', -1, 'kg')).toBe('none of it in a training day');
  });
});
