import { describe, expect, it } from 'vitest';
import { emergencyNumberFor } from './emergency-numbers';

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
