import { describe, expect, it } from 'vitest';
import { emergencyNumberAfter, emergencyNumberFor, followsCountry } from './emergency-numbers';

describe('a new organization’s emergency number', () => {
  it('follows the country where it is known, else 112 (3GPP TS 22.101; EU Universal Service Directive art. 26)', () => {
    expect(emergencyNumberFor('US')).toBe('911');
    expect(emergencyNumberFor('CA')).toBe('911');
    expect(emergencyNumberFor('GB')).toBe('999');
    expect(emergencyNumberFor('AU')).toBe('000');
    expect(emergencyNumberFor('NZ')).toBe('111');
    expect(emergencyNumberFor('NO')).toBe('112');
    expect(emergencyNumberFor('DE')).toBe('112');
  });
});

describe('the emergency number when the country changes in the settings', () => {
  const usDefault = { country: 'US', emergencyNumber: '911' };
  const usByHand = { country: 'US', emergencyNumber: '+1 555 0100' };

  it('a number that is the country’s own follows the new country (GB 999, NO 112)', () => {
    expect(followsCountry(usDefault)).toBe(true);
    expect(emergencyNumberAfter(usDefault, { country: 'GB', emergencyNumber: '911' })).toBe('999');
    expect(emergencyNumberAfter(usDefault, { country: 'NO' })).toBe('112');
  });

  it('a number set by hand is kept, and so is one of an organization with no country recorded', () => {
    expect(followsCountry(usByHand)).toBe(false);
    expect(emergencyNumberAfter(usByHand, { country: 'GB', emergencyNumber: '+1 555 0100' })).toBe('+1 555 0100');
    const noCountry = { country: null, emergencyNumber: '911' };
    expect(followsCountry(noCountry)).toBe(false);
    expect(emergencyNumberAfter(noCountry, { country: 'NO' })).toBe('911');
  });

  it('a number typed in the same edit wins; no country change keeps the number', () => {
    expect(emergencyNumberAfter(usDefault, { country: 'GB', emergencyNumber: '112' })).toBe('112');
    expect(emergencyNumberAfter(usDefault, { country: 'US' })).toBe('911');
    expect(emergencyNumberAfter(usDefault, {})).toBe('911');
  });
});
