import { describe, expect, it } from 'vitest';
import { mostRestrictive, statusOnDate } from './status-on';

describe('participation status on a date', () => {
  const at = (iso: string) => `${iso}T12:00:00.000Z`;

  it('is full with no open case, and the most restrictive across cases', () => {
    expect(statusOnDate([])('2026-12-02')).toBe('full');
    expect(mostRestrictive(['limited', 'out', 'full'])).toBe('out');
    const on = statusOnDate([
      { caseId: 'a', status: 'limited', effectiveFrom: '2026-12-01', createdAt: at('2026-12-01') },
      { caseId: 'b', status: 'out', effectiveFrom: '2026-12-03', createdAt: at('2026-12-01') },
    ]);
    expect(on('2026-11-30')).toBe('full');
    expect(on('2026-12-02')).toBe('limited');
    expect(on('2026-12-03')).toBe('out');
  });

  it("uses each date's own decision: out now, limited from a future date", () => {
    const on = statusOnDate([
      { caseId: 'a', status: 'out', effectiveFrom: '2026-12-01', createdAt: at('2026-12-01') },
      { caseId: 'a', status: 'limited', effectiveFrom: '2026-12-08', createdAt: at('2026-12-02') },
    ]);
    expect(on('2026-12-05')).toBe('out');
    expect(on('2026-12-08')).toBe('limited');
  });

  it('lets a later decision replace an earlier one from its own date, whatever order rows arrive in', () => {
    const changes = [
      { caseId: 'a', status: 'limited' as const, effectiveFrom: '2026-12-10', createdAt: at('2026-12-01') },
      { caseId: 'a', status: 'out' as const, effectiveFrom: '2026-12-05', createdAt: at('2026-12-03') },
    ];
    const on = statusOnDate([...changes].reverse());
    // Decided on the 3rd: out from the 5th on, which also overrides the earlier plan for the 10th.
    expect(on('2026-12-11')).toBe('out');
    expect(on('2026-12-04')).toBe('full');
  });
});
