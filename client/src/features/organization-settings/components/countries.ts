import { COUNTRY_CODES, countryName } from '../../../../../policies/countries';
import { emergencyNumberAfter, emergencyNumberFor, followsCountry } from '../../../../../policies/emergency-numbers';

/** Every ISO 3166-1 country, by its name in English (CLDR, through Intl.DisplayNames), A to Z. */
export function countryChoices(): { code: string; name: string }[] {
  return COUNTRY_CODES.map((code) => ({ code, name: countryName(code) })).sort((a, b) => a.name.localeCompare(b.name));
}

const BASE = "Shown with the warning signs on every athlete's and guardian's page, e.g. 911 or 112.";

/**
 * What the emergency number's hint says, from the saved settings and the form's values: whether it
 * follows the country or was set by hand, and what saving a new country does to it. The number saving
 * would store comes from the same function the server uses, so the sentence cannot promise otherwise.
 */
export function emergencyNumberHint(
  saved: { country: string | null; emergencyNumber: string },
  form: { country?: string; emergencyNumber: string },
): string {
  const country = form.country || undefined;
  if (!country || country === saved.country) {
    if (followsCountry(saved)) return `${BASE} It is the number of the country, so it changes when the country does.`;
    return saved.country ? `${BASE} It was set by hand, so it stays when the country changes.` : BASE;
  }
  const name = countryName(country);
  const usual = emergencyNumberFor(country);
  const saving = emergencyNumberAfter(saved, { country, emergencyNumber: form.emergencyNumber });
  if (saving !== form.emergencyNumber) return `Saving sets ${saving}, the number in ${name}: this number follows the country.`;
  if (!saved.country && form.emergencyNumber === saved.emergencyNumber)
    return `${saved.emergencyNumber} stays: no country was recorded, so it may have been set by hand. The usual number in ${name} is ${usual}: type it here to use it.`;
  if (!followsCountry(saved) && form.emergencyNumber === saved.emergencyNumber)
    return `${saved.emergencyNumber} was set by hand, so it stays with the new country. The usual number in ${name} is ${usual}: type it here to use it.`;
  if (form.emergencyNumber === usual) return `Changed with the country: ${usual} is the number in ${name}. Check it before saving.`;
  return BASE;
}

/** The number the field should show after the country select changes: the new country's, if the field held the old one's. */
export function numberForCountryChange(
  saved: { country: string | null; emergencyNumber: string },
  field: string,
  from: string | undefined,
  to: string | undefined,
): string {
  if (!followsCountry(saved) || !from || !to || field !== emergencyNumberFor(from)) return field;
  return emergencyNumberFor(to);
}
