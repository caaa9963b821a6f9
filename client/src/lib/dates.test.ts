import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { addDaysIso, orgDayOf, setOrgTimeZone, todayLocal } from './dates';
import { formatDateTime } from './format';

// The browser reading the page is in UTC; the organization is somewhere else.
beforeEach(() => {
  vi.stubEnv('TZ', 'UTC');
  vi.useFakeTimers({ toFake: ['Date'] });
});
afterEach(() => {
  vi.useRealTimers();
  vi.unstubAllEnvs();
  setOrgTimeZone(null);
});

describe("the organization's today", () => {
  it('is still yesterday at 02:00 UTC for an organization in Los Angeles (UTC−8)', () => {
    vi.setSystemTime(new Date('2026-03-10T02:00:00Z'));
    setOrgTimeZone('America/Los_Angeles');
    expect(todayLocal()).toBe('2026-03-09');
  });

  it('is already tomorrow at 14:30 UTC for an organization in Sydney (UTC+11 in March)', () => {
    vi.setSystemTime(new Date('2026-03-10T14:30:00Z'));
    setOrgTimeZone('Australia/Sydney');
    expect(todayLocal()).toBe('2026-03-11');
  });

  it('follows the organization when the person switches to another one', () => {
    vi.setSystemTime(new Date('2026-03-10T02:00:00Z'));
    setOrgTimeZone('America/Los_Angeles');
    expect(todayLocal()).toBe('2026-03-09');
    setOrgTimeZone('Europe/Berlin');
    expect(todayLocal()).toBe('2026-03-10');
  });

  it('names the day an instant fell on in the organization, not in the browser', () => {
    setOrgTimeZone('America/Los_Angeles');
    // 18:00 in California on 5 March is already 6 March in UTC.
    expect(orgDayOf('2026-03-06T02:00:00Z')).toBe('2026-03-05');
  });

  it('adds days across the spring-forward weekend without skipping or repeating one', () => {
    vi.stubEnv('TZ', 'America/Los_Angeles');
    expect(addDaysIso('2026-03-07', 1)).toBe('2026-03-08');
    expect(addDaysIso('2026-03-08', 1)).toBe('2026-03-09');
    expect(addDaysIso('2026-11-01', -1)).toBe('2026-10-31');
  });
});

describe('times shown to the reader', () => {
  it('are in the reader’s own time, with the zone named when it differs from the organization’s', () => {
    setOrgTimeZone('America/Los_Angeles');
    expect(formatDateTime('2026-03-10T02:00:00Z')).toBe('10 Mar 2026, 02:00 UTC');
  });

  it('carry no zone when the reader keeps the organization’s clock', () => {
    setOrgTimeZone('Etc/UTC');
    expect(formatDateTime('2026-03-10T02:00:00Z')).toBe('10 Mar 2026, 02:00');
  });

  it('name the reader’s zone as clocks show it, e.g. a reader in Sydney', () => {
    vi.stubEnv('TZ', 'Australia/Sydney');
    setOrgTimeZone('America/Los_Angeles');
    expect(formatDateTime('2026-03-10T02:00:00Z')).toBe('10 Mar 2026, 13:00 GMT+11');
  });

  it('carry no zone outside an organization (an invitation read before signing in)', () => {
    expect(formatDateTime('2026-03-10T02:00:00Z')).toBe('10 Mar 2026, 02:00');
  });
});
