import { afterEach, describe, expect, it } from 'vitest';
import { setOrgTimeZone } from './dates';
import { formatDate, formatDateTime } from './format';

afterEach(() => setOrgTimeZone(null));

describe("the client's one date formatter (policies/words/dates.ts)", () => {
  it('writes a calendar day with its weekday and never as ISO 8601 (3 December 2026 is a Thursday)', () => {
    expect(formatDate('2026-12-03')).toBe('Thu 3 Dec 2026');
    expect(formatDate('2026-12-03')).not.toMatch(/\d{4}-\d{2}-\d{2}/);
    expect(formatDate(null)).toBe('—');
  });

  it("writes an instant as day and time on the reader's clock", () => {
    setOrgTimeZone(Intl.DateTimeFormat().resolvedOptions().timeZone);
    const shown = formatDateTime('2026-12-03T14:05:00Z');
    expect(shown).toMatch(/^\d{1,2} [A-Z][a-z]{2} 2026, \d{2}:\d{2}$/);
    expect(shown).not.toMatch(/\d{4}-\d{2}-\d{2}/);
  });
});
