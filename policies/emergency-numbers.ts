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
