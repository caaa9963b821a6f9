import { describe, expect, it } from 'vitest';
import { nameWithCredential } from './letters';

describe('nameWithCredential', () => {
  it('adds the credential once', () => {
    expect(nameWithCredential('Priya Raman', 'ATC')).toBe('Priya Raman, ATC');
    expect(nameWithCredential('Priya Raman, ATC', 'ATC')).toBe('Priya Raman, ATC');
    expect(nameWithCredential('Marcus Bell, DPT', 'atc')).toBe('Marcus Bell, DPT, atc');
  });
});
