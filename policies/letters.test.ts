import { describe, expect, it } from 'vitest';
import { letterStanding, nameWithCredential } from './letters';

describe('nameWithCredential', () => {
  it('adds the credential once', () => {
    expect(nameWithCredential('Priya Raman', 'ATC')).toBe('Priya Raman, ATC');
    expect(nameWithCredential('Priya Raman, ATC', 'ATC')).toBe('Priya Raman, ATC');
    expect(nameWithCredential('Marcus Bell, DPT', 'atc')).toBe('Marcus Bell, DPT, atc');
  });
});

describe('letterStanding', () => {
  // A signed on 1 March to start that day; B signed on 5 March to start on 12 March.
  const a = { id: 'a', effectiveFrom: '2026-03-01', signedAt: '2026-03-01T09:00:00.000Z' };
  const b = { id: 'b', effectiveFrom: '2026-03-12', signedAt: '2026-03-05T09:00:00.000Z' };
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
    const c = { id: 'c', effectiveFrom: '2026-03-08', signedAt: '2026-03-06T09:00:00.000Z' };
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
    const later = { id: 'later', effectiveFrom: '2026-03-03', signedAt: '2026-03-06T09:00:00.000Z' };
    expect(letterStanding(b, [b, later], '2026-03-12')).toEqual({ status: 'superseded', supersededBy: 'later' });
    expect(letterStanding(later, [b, later], '2026-03-12').status).toBe('signed');
  });

  it('puts a letter alone in force from its start date, not before', () => {
    expect(letterStanding(a, [a], '2026-02-28').status).toBe('scheduled');
    expect(letterStanding(a, [a], '2026-03-01').status).toBe('signed');
  });
});
