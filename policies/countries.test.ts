import { describe, expect, it } from 'vitest';
import { COUNTRY_CODES, countryName, isCountryCode } from './countries';

describe('countries', () => {
  it('lists the 249 officially assigned ISO 3166-1 alpha-2 codes, each once and each named by CLDR', () => {
    // ISO 3166-1:2020 and its online browsing platform: 249 officially assigned alpha-2 codes.
    expect(COUNTRY_CODES).toHaveLength(249);
    expect(new Set(COUNTRY_CODES).size).toBe(249);
    for (const code of COUNTRY_CODES) expect(countryName(code), code).not.toBe(code);
    expect(countryName('NO')).toBe('Norway');
  });

  it('refuses codes that are not assigned, lower case and names', () => {
    for (const bad of ['XX', 'UK', 'no', 'Norway', '', 'USA']) expect(isCountryCode(bad), bad).toBe(false);
    expect(isCountryCode('GB')).toBe(true);
  });
});
