import { jargonIn } from './plain-words';
import { describe, expect, it } from 'vitest';
import { MOVEMENT_PATTERNS, type MovementPattern, type PatternRule } from './load/patterns';
import { letterLimitLines, letterStanding, nameWithCredential } from './letters';

describe('nameWithCredential', () => {
  it('adds the credential once', () => {
    expect(nameWithCredential('Priya Raman', 'ATC')).toBe('Priya Raman, ATC');
    expect(nameWithCredential('Priya Raman, ATC', 'ATC')).toBe('Priya Raman, ATC');
    expect(nameWithCredential('Marcus Bell, DPT', 'atc')).toBe('Marcus Bell, DPT, atc');
  });

  it('prints no part of the credential twice when the form’s example is followed and the name already carries it', () => {
    expect(nameWithCredential('Priya Raman, ATC', 'Athletic trainer, ATC')).toBe('Priya Raman, ATC, Athletic trainer');
    expect(nameWithCredential('Priya Raman', 'Physiotherapist, PT')).toBe('Priya Raman, Physiotherapist, PT');
    expect(nameWithCredential('Priya Raman', 'PT, pt')).toBe('Priya Raman, PT');
    expect(nameWithCredential('Priya Raman', ' ')).toBe('Priya Raman');
  });
});

describe('letterLimitLines', () => {
  const free = Object.fromEntries(MOVEMENT_PATTERNS.map((p) => [p, { mode: 'free' }])) as Record<MovementPattern, PatternRule>;
  it('prints one line per limited movement in plain words, loads in the family’s unit rounded down (NIST SP 811: 1 lb = 0.45359237 kg)', () => {
    const patterns = { ...free, squat: { mode: 'capped' as const, caps: { maxLoadKg: 20 } }, jump: { mode: 'blocked' as const } };
    // 20 kg = 44.0924… lb → 40 lb on the bar (5-lb steps, common practice).
    expect(letterLimitLines(patterns, 'lb')).toEqual([
      'Squatting down and standing back up with weight: nothing heavier than 40 lb.',
      'No jumping or landing.',
    ]);
    expect(letterLimitLines(patterns, 'kg')).toEqual([
      'Squatting down and standing back up with weight: nothing heavier than 20 kg.',
      'No jumping or landing.',
    ]);
    for (const line of letterLimitLines(patterns, 'lb')) expect(jargonIn(line)).toEqual([]);
    expect(letterLimitLines(free, 'kg')).toEqual([]);
  });
});

describe('letterStanding', () => {
  // A signed on 1 March to start that day; B signed on 5 March to start on 12 March.
  const a = { id: 'a', effectiveFrom: '2026-03-01', signedAt: '2026-03-01T09:00:00.000Z', validUntil: null };
  const b = { id: 'b', effectiveFrom: '2026-03-12', signedAt: '2026-03-05T09:00:00.000Z', validUntil: null };
  const both = [a, b];

  it('keeps the earlier letter in force until the later one starts, which is scheduled meanwhile', () => {
    expect(letterStanding(a, both, '2026-03-05')).toEqual({ status: 'signed', supersededBy: null });
    expect(letterStanding(b, both, '2026-03-05')).toEqual({ status: 'scheduled', supersededBy: null });
    expect(letterStanding(a, both, '2026-03-11')).toEqual({ status: 'signed', supersededBy: null });
  });

  it('supersedes the earlier letter on the later one’s start date', () => {
    expect(letterStanding(a, both, '2026-03-12')).toEqual({ status: 'superseded', supersededBy: 'b' });
    expect(letterStanding(b, both, '2026-03-12')).toEqual({ status: 'signed', supersededBy: null });
  });

  it('lets a later-signed letter that starts sooner replace a scheduled one before it ever starts', () => {
    // C signed on 6 March to start on 8 March: it replaces A on the 8th and B never comes into force.
    const c = { id: 'c', effectiveFrom: '2026-03-08', signedAt: '2026-03-06T09:00:00.000Z', validUntil: null };
    const all = [a, b, c];
    expect(letterStanding(a, all, '2026-03-07').status).toBe('signed');
    expect(letterStanding(b, all, '2026-03-07').status).toBe('scheduled');
    expect(letterStanding(c, all, '2026-03-07').status).toBe('scheduled');
    expect(letterStanding(a, all, '2026-03-08')).toEqual({ status: 'superseded', supersededBy: 'c' });
    expect(letterStanding(b, all, '2026-03-08')).toEqual({ status: 'superseded', supersededBy: 'c' });
    expect(letterStanding(c, all, '2026-03-08').status).toBe('signed');
    expect(letterStanding(c, all, '2026-03-20').status).toBe('signed');
  });

  it('lets signing order decide, not start dates: a later-signed letter that starts sooner wins', () => {
    const later = { id: 'later', effectiveFrom: '2026-03-03', signedAt: '2026-03-06T09:00:00.000Z', validUntil: null };
    expect(letterStanding(b, [b, later], '2026-03-12')).toEqual({ status: 'superseded', supersededBy: 'later' });
    expect(letterStanding(later, [b, later], '2026-03-12').status).toBe('signed');
  });

  it('puts a letter alone in force from its start date, not before', () => {
    expect(letterStanding(a, [a], '2026-02-28').status).toBe('scheduled');
    expect(letterStanding(a, [a], '2026-03-01').status).toBe('signed');
  });

  describe('valid until', () => {
    // R signed on 1 March to start that day, valid until (its review on) 31 March.
    const r = { id: 'r', effectiveFrom: '2026-03-01', signedAt: '2026-03-01T09:00:00.000Z', validUntil: '2026-03-31' };

    it('keeps the letter in force on its valid-until day and expires it the day after', () => {
      expect(letterStanding(r, [r], '2026-03-31')).toEqual({ status: 'signed', supersededBy: null });
      expect(letterStanding(r, [r], '2026-04-01')).toEqual({ status: 'expired', supersededBy: null });
    });

    it('leaves a superseded letter superseded after its valid-until day', () => {
      const next = { id: 'next', effectiveFrom: '2026-03-20', signedAt: '2026-03-15T09:00:00.000Z', validUntil: null };
      expect(letterStanding(r, [r, next], '2026-04-01')).toEqual({ status: 'superseded', supersededBy: 'next' });
      expect(letterStanding(next, [r, next], '2026-04-01').status).toBe('signed');
    });

    it('leaves a scheduled letter scheduled, and an expired later letter still replaces the earlier one', () => {
      const odd = { id: 'odd', effectiveFrom: '2026-05-01', signedAt: '2026-03-02T09:00:00.000Z', validUntil: '2026-03-10' };
      expect(letterStanding(odd, [r, odd], '2026-04-01').status).toBe('scheduled');
      const short = { id: 'short', effectiveFrom: '2026-03-05', signedAt: '2026-03-04T09:00:00.000Z', validUntil: '2026-03-10' };
      expect(letterStanding(short, [r, short], '2026-03-11').status).toBe('expired');
      expect(letterStanding(r, [r, short], '2026-03-11')).toEqual({ status: 'superseded', supersededBy: 'short' });
    });
  });
});
