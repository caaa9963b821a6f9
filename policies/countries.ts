/**
 * ISO 3166-1 alpha-2 country codes (the officially assigned ones, 249). An organization records its
 * country as one of these; people read it through the runtime's own country names
 * (`Intl.DisplayNames`, CLDR), so no list of names is kept here.
 */
export const COUNTRY_CODES = [
  ...'AD AE AF AG AI AL AM AO AQ AR AS AT AU AW AX AZ'.split(' '),
  ...'BA BB BD BE BF BG BH BI BJ BL BM BN BO BQ BR BS BT BV BW BY BZ'.split(' '),
  ...'CA CC CD CF CG CH CI CK CL CM CN CO CR CU CV CW CX CY CZ'.split(' '),
  ...'DE DJ DK DM DO DZ EC EE EG EH ER ES ET FI FJ FK FM FO FR'.split(' '),
  ...'GA GB GD GE GF GG GH GI GL GM GN GP GQ GR GS GT GU GW GY HK HM HN HR HT HU'.split(' '),
  ...'ID IE IL IM IN IO IQ IR IS IT JE JM JO JP KE KG KH KI KM KN KP KR KW KY KZ'.split(' '),
  ...'LA LB LC LI LK LR LS LT LU LV LY'.split(' '),
  ...'MA MC MD ME MF MG MH MK ML MM MN MO MP MQ MR MS MT MU MV MW MX MY MZ'.split(' '),
  ...'NA NC NE NF NG NI NL NO NP NR NU NZ OM PA PE PF PG PH PK PL PM PN PR PS PT PW PY QA'.split(' '),
  ...'RE RO RS RU RW SA SB SC SD SE SG SH SI SJ SK SL SM SN SO SR SS ST SV SX SY SZ'.split(' '),
  ...'TC TD TF TG TH TJ TK TL TM TN TO TR TT TV TW TZ UA UG UM US UY UZ'.split(' '),
  ...'VA VC VE VG VI VN VU WF WS YE YT ZA ZM ZW'.split(' '),
] as const;

const CODES: ReadonlySet<string> = new Set(COUNTRY_CODES);

export function isCountryCode(value: string): boolean {
  return CODES.has(value);
}

/** The country's name in English ("Norway"), or the code itself where the runtime has no name for it. */
export function countryName(code: string, locale = 'en'): string {
  try {
    return new Intl.DisplayNames([locale], { type: 'region' }).of(code) ?? code;
  } catch {
    return code;
  }
}
