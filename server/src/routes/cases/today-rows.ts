import { addDays } from '../../../../policies/today';

export interface AwkwardInstant {
  /** How the row reads in a test name. */
  when: string;
  timeZone: string;
  /** The instant, with the zone's offset at that moment. */
  instant: string;
  /** The organization's local day at that instant. */
  day: string;
}

/**
 * Instants at which the organization's day and the UTC day differ: 23:30 west of UTC (UTC is already
 * tomorrow), 00:30 east of UTC (UTC is still yesterday), right around UTC midnight and far from it,
 * and both DST change days of 2026 in Los Angeles (IANA tz database: second Sunday of March, first
 * Sunday of November).
 */
export const AWKWARD_INSTANTS: AwkwardInstant[] = [
  {
    when: '23:30 in Los Angeles (06:30 UTC next day)',
    timeZone: 'America/Los_Angeles',
    instant: '2026-06-10T23:30:00-07:00',
    day: '2026-06-10',
  },
  {
    when: '23:30 in Cape Verde (00:30 UTC next day)',
    timeZone: 'Atlantic/Cape_Verde',
    instant: '2026-06-10T23:30:00-01:00',
    day: '2026-06-10',
  },
  {
    when: '00:30 in London (23:30 UTC the day before)',
    timeZone: 'Europe/London',
    instant: '2026-06-11T00:30:00+01:00',
    day: '2026-06-11',
  },
  {
    when: '00:30 in Sydney (14:30 UTC the day before)',
    timeZone: 'Australia/Sydney',
    instant: '2026-06-11T00:30:00+10:00',
    day: '2026-06-11',
  },
  {
    when: '23:30 on the spring DST change day in Los Angeles',
    timeZone: 'America/Los_Angeles',
    instant: '2026-03-08T23:30:00-07:00',
    day: '2026-03-08',
  },
  {
    when: '17:30 on the autumn DST change day in Los Angeles',
    timeZone: 'America/Los_Angeles',
    instant: '2026-11-01T17:30:00-08:00',
    day: '2026-11-01',
  },
];

export const nextDay = (day: string) => addDays(day, 1);
