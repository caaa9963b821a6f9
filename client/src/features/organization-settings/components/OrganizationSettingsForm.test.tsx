import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import type { OrganizationSettingsDto } from '../../../../../policies/dto';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { OrganizationSettingsForm } from './OrganizationSettingsForm';
import { timeZoneChoices } from './time-zones';

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => vi.stubGlobal('fetch', fetchMock));
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

const settings: OrganizationSettingsDto = {
  id: 'org-1',
  name: 'Harbor Point Performance',
  emergencyNumber: '911',
  guardiansSeeClips: false,
  timeZone: 'America/Los_Angeles',
  letterPaper: null,
  letterPaperInUse: 'letter',
  country: 'US',
  emergencyNumberFollowsCountry: true,
  version: 3,
};

describe('OrganizationSettingsForm', () => {
  it('shows the organization’s time zone chosen, and says what it changes', () => {
    renderWithProviders(<OrganizationSettingsForm orgId="org-1" settings={settings} />);
    const zone = screen.getByRole('combobox', { name: 'Time zone' });
    expect(zone).toHaveValue('America/Los_Angeles');
    expect(screen.getByRole('option', { name: 'America/Los Angeles', selected: true })).toBeInTheDocument();
    expect(zone).toHaveAccessibleDescription(/which day counts as today for everyone here/);
  });

  it('sends the zone the admin chose, with the version read', async () => {
    fetchMock.mockImplementation(async () => jsonResponse(200, { ...settings, timeZone: 'Australia/Sydney', version: 4 }));
    renderWithProviders(<OrganizationSettingsForm orgId="org-1" settings={settings} />);
    fireEvent.change(screen.getByRole('combobox', { name: 'Time zone' }), { target: { value: 'Australia/Sydney' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save settings' }));

    await waitFor(() => expect(fetchMock).toHaveBeenCalledTimes(1));
    const [url, init] = fetchMock.mock.calls[0];
    expect(url).toBe('/api/orgs/org-1/settings');
    expect(init?.method).toBe('PATCH');
    expect(JSON.parse(init?.body as string)).toMatchObject({ timeZone: 'Australia/Sydney', version: 3 });
  });

  it('offers every zone the browser knows, and keeps UTC and the current zone even when that list leaves them out', () => {
    const choices = timeZoneChoices('Etc/GMT+8');
    expect(choices).toEqual(expect.arrayContaining(['UTC', 'Etc/GMT+8', 'America/Los_Angeles', 'Australia/Sydney', 'Europe/Berlin']));
    expect(new Set(choices).size).toBe(choices.length);
    expect(choices).toEqual([...choices].sort());
  });

  it('ISO 216 / ANSI: offers By country, US Letter and A4 for letters, saying which is in use, and sends the choice', async () => {
    fetchMock.mockImplementation(async () => jsonResponse(200, { ...settings, letterPaper: 'a4', letterPaperInUse: 'a4', version: 4 }));
    renderWithProviders(<OrganizationSettingsForm orgId="org-1" settings={settings} />);
    const paper = screen.getByRole('combobox', { name: 'Paper for clearance letters' });
    expect(paper).toHaveValue('');
    expect(paper).toHaveAccessibleDescription(/Letters print on US Letter \(8\.5 × 11 in\) now/);
    // The paper follows the country in the form before it is saved.
    fireEvent.change(screen.getByRole('combobox', { name: 'Country' }), { target: { value: 'DE' } });
    expect(paper).toHaveAccessibleDescription(/Letters will print on A4 \(210 × 297 mm\) once saved/);
    fireEvent.change(screen.getByRole('combobox', { name: 'Country' }), { target: { value: 'US' } });
    expect(screen.getByRole('option', { name: 'A4 (210 × 297 mm)' })).toBeInTheDocument();
    fireEvent.change(paper, { target: { value: 'a4' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save settings' }));
    await waitFor(() => expect(fetchMock).toHaveBeenCalledTimes(1));
    expect(JSON.parse(fetchMock.mock.calls[0][1]?.body as string)).toMatchObject({ letterPaper: 'a4', version: 3 });
  });

  it('a new country brings its emergency number when the number was the old country’s, and both are sent with the version read', async () => {
    fetchMock.mockImplementation(async () => jsonResponse(200, { ...settings, country: 'GB', emergencyNumber: '999', version: 4 }));
    renderWithProviders(<OrganizationSettingsForm orgId="org-1" settings={settings} />);
    const number = screen.getByRole('textbox', { name: 'Local emergency number' });
    expect(number).toHaveAccessibleDescription(/It is the number of the country, so it changes when the country does/);
    const country = screen.getByRole('combobox', { name: 'Country' });
    expect(country).toHaveValue('US');
    fireEvent.change(country, { target: { value: 'NO' } });
    expect(number).toHaveValue('112');
    fireEvent.change(country, { target: { value: 'GB' } });
    expect(number).toHaveValue('999');
    expect(number).toHaveAccessibleDescription('Changed with the country: 999 is the number in United Kingdom. Check it before saving.');
    fireEvent.click(screen.getByRole('button', { name: 'Save settings' }));
    await waitFor(() => expect(fetchMock).toHaveBeenCalledTimes(1));
    expect(JSON.parse(fetchMock.mock.calls[0][1]?.body as string)).toMatchObject({ country: 'GB', emergencyNumber: '999', version: 3 });
  });

  it('keeps a number set by hand when the country changes, and says so with the new country’s usual number', () => {
    const byHand = { ...settings, emergencyNumber: '+1 555 0100', emergencyNumberFollowsCountry: false };
    renderWithProviders(<OrganizationSettingsForm orgId="org-1" settings={byHand} />);
    const number = screen.getByRole('textbox', { name: 'Local emergency number' });
    expect(number).toHaveAccessibleDescription(/It was set by hand, so it stays when the country changes/);
    fireEvent.change(screen.getByRole('combobox', { name: 'Country' }), { target: { value: 'NO' } });
    expect(number).toHaveValue('+1 555 0100');
    expect(number).toHaveAccessibleDescription(
      '+1 555 0100 was set by hand, so it stays with the new country. The usual number in Norway is 112: type it here to use it.',
    );
  });

  it('an organization with no country recorded is asked to choose one; the server’s refusal shows on the Country field', async () => {
    fetchMock.mockImplementation(async () =>
      jsonResponse(400, {
        error: {
          code: 'validation_failed',
          message: 'Check the form.',
          fields: { country: ['must be a two-letter country code (ISO 3166-1) such as NO or US'] },
        },
        requestId: 'r1',
      }),
    );
    renderWithProviders(
      <OrganizationSettingsForm orgId="org-1" settings={{ ...settings, country: null, emergencyNumberFollowsCountry: false }} />,
    );
    const country = screen.getByRole('combobox', { name: 'Country' });
    expect(country).toHaveValue('');
    expect(screen.getByRole('option', { name: 'Not recorded: choose the country' })).toBeInTheDocument();
    fireEvent.change(country, { target: { value: 'AU' } });
    const number = screen.getByRole('textbox', { name: 'Local emergency number' });
    expect(number).toHaveValue('911');
    expect(number).toHaveAccessibleDescription(
      /911 stays: no country was recorded, so it may have been set by hand. The usual number in Australia is 000/,
    );
    fireEvent.click(screen.getByRole('button', { name: 'Save settings' }));
    expect(await screen.findByText(/must be a two-letter country code/)).toBeInTheDocument();
    expect(country).toHaveAccessibleDescription(/must be a two-letter country code/);
  });
});
