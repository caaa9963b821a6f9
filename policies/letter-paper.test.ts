import { describe, expect, it } from 'vitest';
import { letterPaperOf, paperForCountry, paperForTimeZone } from './letter-paper';

// Letter countries: ANSI/ASME Y14.1 Letter is the everyday size in the US, Canada, Mexico and the
// Philippines (and several Central and South American countries); the rest of the world uses ISO 216 A4.
describe('the paper of a letter', () => {
  it('follows the country of the time zone (tzdata zone.tab) when the organization has not chosen', () => {
    for (const zone of [
      'America/Chicago',
      'America/Indiana/Indianapolis',
      'US/Eastern',
      'America/Toronto',
      'America/Mexico_City',
      'Asia/Manila',
      'Pacific/Honolulu',
    ])
      expect(paperForTimeZone(zone), zone).toBe('letter');
    for (const zone of ['UTC', 'Europe/London', 'Australia/Brisbane', 'America/Sao_Paulo', 'America/Argentina/Buenos_Aires', 'Asia/Tokyo'])
      expect(paperForTimeZone(zone), zone).toBe('a4');
  });

  it('follows the recorded country (ISO 3166-1 alpha-2) over the time zone', () => {
    for (const country of ['US', 'CA', 'MX', 'PH', 'CL', 'CO', 'us']) expect(paperForCountry(country), country).toBe('letter');
    for (const country of ['GB', 'DE', 'AU', 'BR', 'AR', 'JP', 'NO']) expect(paperForCountry(country), country).toBe('a4');
    expect(letterPaperOf({ letterPaper: null, country: 'DE', timeZone: 'America/Chicago' })).toBe('a4');
    expect(letterPaperOf({ letterPaper: null, country: 'US', timeZone: 'Europe/Berlin' })).toBe('letter');
    // No country recorded (organizations made before countries were): the zone's country.
    expect(letterPaperOf({ letterPaper: null, country: null, timeZone: 'America/Chicago' })).toBe('letter');
  });

  it("the organization's choice wins", () => {
    expect(letterPaperOf({ letterPaper: 'a4', timeZone: 'America/Chicago' })).toBe('a4');
    expect(letterPaperOf({ letterPaper: 'letter', timeZone: 'Europe/Berlin' })).toBe('letter');
    expect(letterPaperOf({ letterPaper: null, timeZone: 'Europe/Berlin' })).toBe('a4');
  });
});
