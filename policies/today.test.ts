import { describe, expect, it } from 'vitest';
import { addDays, dayIn, hourIn, isTimeZone, orgToday, zoneDiffers } from './today';

// Offsets and daylight-saving dates from the IANA time zone database (tzdata), as shipped with Node.js:
// America/Los_Angeles is UTC−8 (PST) and UTC−7 (PDT, from the second Sunday of March to the first
// Sunday of November, US Energy Policy Act of 2005); Australia/Brisbane is UTC+10 all year;
// Australia/Sydney is UTC+10 (AEST) and UTC+11 (AEDT, first Sunday of October to first Sunday of April).

describe('orgToday: the organization’s local day', () => {
  it('at 23:30 local in a UTC−8 organization (07:30 UTC next day) is still the local day', () => {
    expect(orgToday('America/Los_Angeles', new Date('2026-12-04T07:30:00Z'))).toBe('2026-12-03');
  });

  it('at 00:30 local in a UTC−8 organization (08:30 UTC) is the new local day', () => {
    expect(orgToday('America/Los_Angeles', new Date('2026-12-04T08:30:00Z'))).toBe('2026-12-04');
  });

  it('an emergency at 18:00 in California (02:00 UTC next day) falls on the Californian day', () => {
    expect(orgToday('America/Los_Angeles', new Date('2026-12-04T02:00:00Z'))).toBe('2026-12-03');
  });

  it('at 23:30 local in a UTC+10 organization (13:30 UTC) is the local day, a day ahead of UTC’s at 23:30 UTC', () => {
    expect(orgToday('Australia/Brisbane', new Date('2026-12-03T13:30:00Z'))).toBe('2026-12-03');
    expect(orgToday('Australia/Brisbane', new Date('2026-12-03T23:30:00Z'))).toBe('2026-12-04');
  });

  it('at 00:30 local in a UTC+10 organization (14:30 UTC the day before) is already the new day', () => {
    expect(orgToday('Australia/Brisbane', new Date('2026-12-03T14:30:00Z'))).toBe('2026-12-04');
  });

  it('on both sides of UTC midnight: 23:30 UTC and 00:30 UTC give UTC’s days for a UTC organization', () => {
    expect(orgToday('UTC', new Date('2026-12-03T23:30:00Z'))).toBe('2026-12-03');
    expect(orgToday('UTC', new Date('2026-12-04T00:30:00Z'))).toBe('2026-12-04');
  });

  it('on the day daylight saving starts in Los Angeles (2026-03-08, 02:00 PST → 03:00 PDT)', () => {
    // 07:59 UTC is 23:59 PST on the 7th; 08:00 UTC is 00:00 PST on the 8th; 10:00 UTC is 03:00 PDT.
    expect(orgToday('America/Los_Angeles', new Date('2026-03-08T07:59:00Z'))).toBe('2026-03-07');
    expect(orgToday('America/Los_Angeles', new Date('2026-03-08T08:00:00Z'))).toBe('2026-03-08');
    expect(hourIn('America/Los_Angeles', new Date('2026-03-08T10:00:00Z'))).toBe(3);
    // The day ends at 07:00 UTC (midnight PDT), an hour earlier than it began.
    expect(orgToday('America/Los_Angeles', new Date('2026-03-09T06:59:00Z'))).toBe('2026-03-08');
    expect(orgToday('America/Los_Angeles', new Date('2026-03-09T07:00:00Z'))).toBe('2026-03-09');
  });

  it('on the day daylight saving ends in Los Angeles (2026-11-01, 02:00 PDT → 01:00 PST)', () => {
    expect(orgToday('America/Los_Angeles', new Date('2026-11-01T06:59:00Z'))).toBe('2026-10-31');
    expect(orgToday('America/Los_Angeles', new Date('2026-11-01T07:00:00Z'))).toBe('2026-11-01');
    expect(orgToday('America/Los_Angeles', new Date('2026-11-02T07:59:00Z'))).toBe('2026-11-01');
    expect(orgToday('America/Los_Angeles', new Date('2026-11-02T08:00:00Z'))).toBe('2026-11-02');
  });

  it('in Sydney across the start of daylight saving (2026-10-04, 02:00 AEST → 03:00 AEDT)', () => {
    expect(orgToday('Australia/Sydney', new Date('2026-10-03T13:59:00Z'))).toBe('2026-10-03');
    expect(orgToday('Australia/Sydney', new Date('2026-10-03T14:00:00Z'))).toBe('2026-10-04');
    // The next local midnight is 13:00 UTC (UTC+11).
    expect(orgToday('Australia/Sydney', new Date('2026-10-04T13:00:00Z'))).toBe('2026-10-05');
  });

  it('falls back to UTC for an unknown zone rather than failing', () => {
    expect(isTimeZone('Mars/Olympus_Mons')).toBe(false);
    expect(orgToday('Mars/Olympus_Mons', new Date('2026-12-03T23:30:00Z'))).toBe('2026-12-03');
  });
});

describe('isTimeZone', () => {
  it('knows IANA names and refuses others', () => {
    expect(isTimeZone('America/Chicago')).toBe(true);
    expect(isTimeZone('Europe/Berlin')).toBe(true);
    expect(isTimeZone('UTC')).toBe(true);
    expect(isTimeZone('')).toBe(false);
    expect(isTimeZone('x'.repeat(65))).toBe(false);
    expect(isTimeZone('Not/AZone')).toBe(false);
  });
});

describe('calendar arithmetic on days', () => {
  it('adds days across months, leap days and years', () => {
    expect(addDays('2026-12-31', 1)).toBe('2027-01-01');
    expect(addDays('2028-02-28', 1)).toBe('2028-02-29');
    expect(addDays('2026-03-01', -1)).toBe('2026-02-28');
    // A DST change day is still one calendar day.
    expect(addDays('2026-03-07', 1)).toBe('2026-03-08');
  });

  it('dayIn is the same function for any instant and zone', () => {
    expect(dayIn('Pacific/Kiritimati', new Date('2026-12-03T10:30:00Z'))).toBe('2026-12-04');
    expect(dayIn('Pacific/Pago_Pago', new Date('2026-12-03T10:30:00Z'))).toBe('2026-12-02');
  });
});

describe('zoneDiffers', () => {
  it('is false for the same offset and true across zones', () => {
    const t = new Date('2026-12-03T12:00:00Z');
    expect(zoneDiffers('America/Los_Angeles', 'America/Los_Angeles', t)).toBe(false);
    expect(zoneDiffers('UTC', 'Etc/UTC', t)).toBe(false);
    expect(zoneDiffers('UTC', 'America/Los_Angeles', t)).toBe(true);
  });
});
