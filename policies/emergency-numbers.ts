/**
 * The emergency number a new organization starts with, from its country; the admin checks it in the
 * organization's settings (the stop-and-seek-care screen shows it). Sources: the North American
 * Numbering Plan countries and Mexico use 911; the United Kingdom 999, Australia 000 and New Zealand
 * 111 (each country's own emergency services). Everywhere else 112, which the GSM standard
 * (3GPP TS 22.101) has every mobile phone put through to the local emergency service, and which is
 * the single number of the European Union (Universal Service Directive 2002/22/EC, article 26).
 * The list is deliberately short: a country not named here starts with 112 and its admin corrects it.
 */
const BY_COUNTRY: Record<string, string> = {
  US: '911',
  CA: '911',
  MX: '911',
  PR: '911',
  VI: '911',
  GU: '911',
  AS: '911',
  MP: '911',
  GB: '999',
  AU: '000',
  NZ: '111',
};

export function emergencyNumberFor(country: string): string {
  return BY_COUNTRY[country] ?? '112';
}

/**
 * Whether the organization's emergency number is still the one its country gives. An admin may type
 * any number in the settings; one that differs from the country's is theirs (set by hand). With no
 * country recorded (organizations made before it was asked) nobody can tell, so it counts as set by hand.
 */
export function followsCountry(org: { country: string | null; emergencyNumber: string }): boolean {
  return org.country !== null && org.emergencyNumber === emergencyNumberFor(org.country);
}

/**
 * The number after a settings edit. A number typed in the same edit wins. Otherwise, when the country
 * changes, a number that followed the old country follows the new one, and a number set by hand is
 * kept: the admin chose it, and a wrong guess on the stop-and-get-care screen is worse than asking.
 * Both sides use this: the form says beforehand what saving will do, the server decides.
 */
export function emergencyNumberAfter(
  before: { country: string | null; emergencyNumber: string },
  edit: { country?: string; emergencyNumber?: string },
): string {
  if (edit.emergencyNumber !== undefined && edit.emergencyNumber !== before.emergencyNumber) return edit.emergencyNumber;
  if (edit.country === undefined || edit.country === before.country || !followsCountry(before)) return before.emergencyNumber;
  return emergencyNumberFor(edit.country);
}
