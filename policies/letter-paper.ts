/**
 * The paper a clearance letter is printed on. Most of the world uses ISO 216 A4 (210 × 297 mm);
 * the United States, Canada, Mexico, the Philippines and several Central and South American countries
 * use ANSI Letter (8.5 × 11 in). An organization may choose; until it does, its recorded country
 * decides, and for an organization that has recorded none (made before countries were recorded) the
 * country of its time zone.
 */
export const LETTER_PAPERS = ['letter', 'a4'] as const;
export type LetterPaper = (typeof LETTER_PAPERS)[number];

export const PAPER_LABELS: Record<LetterPaper, string> = { letter: 'US Letter (8.5 × 11 in)', a4: 'A4 (210 × 297 mm)' };

/** IANA zones of the Letter countries: US, CA, MX, PH, CL, CO, VE, CR, DO, GT, PA, PR, SV, NI, BZ (tzdata zone.tab), with the old US/ and Canada/ aliases. */
const LETTER_ZONE_PREFIXES = ['US/', 'Canada/', 'Mexico/', 'America/Indiana/', 'America/Kentucky/', 'America/North_Dakota/'];
const LETTER_ZONES = new Set(
  [
    // US
    'Adak Anchorage Boise Chicago Denver Detroit Juneau Los_Angeles Menominee Metlakatla New_York Nome Phoenix Sitka Yakutat Indianapolis Louisville',
    // CA
    'Atikokan Blanc-Sablon Cambridge_Bay Creston Dawson Dawson_Creek Edmonton Fort_Nelson Glace_Bay Goose_Bay Halifax Inuvik Iqaluit Moncton Rankin_Inlet Regina Resolute St_Johns Swift_Current Toronto Vancouver Whitehorse Winnipeg',
    // MX
    'Bahia_Banderas Cancun Chihuahua Ciudad_Juarez Hermosillo Matamoros Mazatlan Merida Mexico_City Monterrey Ojinaga Tijuana',
    // CL, CO, VE, CR, DO, GT, PA, PR, SV, NI, BZ
    'Coyhaique Punta_Arenas Santiago Bogota Caracas Costa_Rica Santo_Domingo Guatemala Panama Puerto_Rico El_Salvador Managua Belize',
  ]
    .join(' ')
    .split(' ')
    .map((z) => `America/${z}`)
    .concat(['Pacific/Honolulu', 'Pacific/Easter', 'Asia/Manila', 'US/Hawaii']),
);

/** ISO 3166-1 alpha-2 codes of the Letter countries (the same countries as the zones above). */
const LETTER_COUNTRIES = new Set(['US', 'CA', 'MX', 'PH', 'CL', 'CO', 'VE', 'CR', 'DO', 'GT', 'PA', 'PR', 'SV', 'NI', 'BZ']);

/** The paper of a country (ISO 3166-1 alpha-2): Letter for the Letter countries, else A4. */
export function paperForCountry(country: string): LetterPaper {
  return LETTER_COUNTRIES.has(country.toUpperCase()) ? 'letter' : 'a4';
}

/** The paper of a time zone's country: Letter for the zones of Letter countries, else A4. */
export function paperForTimeZone(timeZone: string): LetterPaper {
  return LETTER_ZONES.has(timeZone) || LETTER_ZONE_PREFIXES.some((p) => timeZone.startsWith(p)) ? 'letter' : 'a4';
}

/**
 * The organization's chosen paper, or (null: not chosen) the paper of its recorded country, or (no
 * country recorded) of its time zone's country.
 */
export function letterPaperOf(org: { letterPaper: LetterPaper | null; country?: string | null; timeZone: string }): LetterPaper {
  return org.letterPaper ?? (org.country ? paperForCountry(org.country) : paperForTimeZone(org.timeZone));
}
