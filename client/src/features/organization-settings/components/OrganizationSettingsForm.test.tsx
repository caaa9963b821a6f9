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
    expect(screen.getByRole('option', { name: 'A4 (210 × 297 mm)' })).toBeInTheDocument();
    fireEvent.change(paper, { target: { value: 'a4' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save settings' }));
    await waitFor(() => expect(fetchMock).toHaveBeenCalledTimes(1));
    expect(JSON.parse(fetchMock.mock.calls[0][1]?.body as string)).toMatchObject({ letterPaper: 'a4', version: 3 });
  });
});
