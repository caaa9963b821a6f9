/**
 * The time zones an admin can choose from: every IANA zone the browser knows
 * (Intl.supportedValuesOf, ECMA-402), plus the organization's current one and UTC, which some
 * browsers leave out of that list.
 */
export function timeZoneChoices(current: string): string[] {
  return [...new Set([current, 'UTC', ...Intl.supportedValuesOf('timeZone')])].sort();
}

/** 'America/Los_Angeles' → 'America/Los Angeles': the IANA name, readable. */
export function timeZoneLabel(zone: string): string {
  return zone.replaceAll('_', ' ');
}
