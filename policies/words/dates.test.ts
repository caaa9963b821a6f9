import { describe, expect, it } from 'vitest';
import { humanDate, humanDateTime, humanDay, humanizeIsoDates } from './dates';

describe("dates in Loadline's one human format (ISO 8601 days in, words out)", () => {
  it('writes a calendar day with its weekday: 2026-12-03 was a Thursday (ISO 8601 Gregorian calendar)', () => {
    expect(humanDate('2026-12-03')).toBe('Thu 3 Dec 2026');
    expect(humanDate('2024-02-29')).toBe('Thu 29 Feb 2024');
    expect(humanDate('2000-01-01')).toBe('Sat 1 Jan 2000');
    expect(humanDay('2026-09-14')).toBe('14 Sep 2026');
  });

  it('leaves text that is not a real day as it is, never a plausible wrong date', () => {
    expect(humanDate('2026-02-30')).toBe('2026-02-30');
    expect(humanDate('soon')).toBe('soon');
  });

  it("writes an instant on the reader's wall clock (IANA tz database offsets)", () => {
    expect(humanDateTime('2026-12-03T14:05:00Z', 'UTC')).toBe('3 Dec 2026, 14:05');
    // New York is UTC−5 in December: 02:30Z is still 2 December there.
    expect(humanDateTime('2026-12-03T02:30:00Z', 'America/New_York')).toBe('2 Dec 2026, 21:30');
    // Sydney is UTC+11 in December (daylight saving).
    expect(humanDateTime(new Date('2026-12-03T14:05:00Z'), 'Australia/Sydney')).toBe('4 Dec 2026, 01:05');
    expect(humanDateTime('2026-06-01T00:00:00Z', 'UTC')).toBe('1 Jun 2026, 00:00');
  });

  it('rewrites ISO days inside stored sentences', () => {
    expect(humanizeIsoDates('Maya Torres, session of 2026-12-03: reduce.')).toBe('Maya Torres, session of Thu 3 Dec 2026: reduce.');
  });
});
