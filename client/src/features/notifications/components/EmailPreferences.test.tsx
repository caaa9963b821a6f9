import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import type { NoticePreferenceDto } from '../../../../../policies/dto';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { EmailPreferences } from './EmailPreferences';

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => vi.stubGlobal('fetch', fetchMock));
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

const PREFS: NoticePreferenceDto[] = [
  { kind: 'red_flag_emergency_guardian', label: 'Your athlete was told to get urgent medical care', email: true, fixed: true },
  { kind: 'plan_changed', label: 'A new version of the limits (restriction plan)', email: true, fixed: false },
];

describe('e-mail choices', () => {
  it('the box follows the click in the same render, even while a reload of the choices is still on its way', async () => {
    fetchMock.mockResolvedValueOnce(jsonResponse(200, PREFS));
    renderWithProviders(<EmailPreferences orgId="org-1" />);
    const plans = await screen.findByRole('checkbox', { name: 'A new version of the limits (restriction plan)' });
    // Every later request (the PATCH) hangs: nothing settles while the box is looked at.
    fetchMock.mockImplementation(() => new Promise<Response>(() => {}));
    fireEvent.click(plans);
    expect(plans).not.toBeChecked();
  });

  it('shows an emergency as ticked and fixed, with the reason in words (not a greyed box alone)', async () => {
    fetchMock.mockResolvedValue(jsonResponse(200, PREFS));
    renderWithProviders(<EmailPreferences orgId="org-1" />);
    const emergency = await screen.findByRole('checkbox', { name: /Your athlete was told to get urgent medical care/ });
    expect(emergency).toBeChecked();
    expect(emergency).toBeDisabled();
    expect(emergency).toHaveAccessibleDescription('Emergency: always e-mailed, so it cannot be switched off.');
  });

  it('unticking a kind sends only that kind, and the box follows the click at once', async () => {
    fetchMock.mockResolvedValueOnce(jsonResponse(200, PREFS));
    fetchMock.mockResolvedValueOnce(jsonResponse(200, [PREFS[0], { ...PREFS[1], email: false }]));
    renderWithProviders(<EmailPreferences orgId="org-1" />);
    const plans = await screen.findByRole('checkbox', { name: 'A new version of the limits (restriction plan)' });
    fireEvent.click(plans);
    await waitFor(() => expect(plans).not.toBeChecked());
    await waitFor(() => expect(fetchMock).toHaveBeenCalledTimes(2));
    expect(String(fetchMock.mock.calls[1][0])).toBe('/api/orgs/org-1/notice-preferences');
    expect(fetchMock.mock.calls[1][1]?.method).toBe('PATCH');
    expect(JSON.parse(String(fetchMock.mock.calls[1][1]?.body))).toEqual({ email: { plan_changed: false } });
    expect(await screen.findByRole('status')).toHaveTextContent('Your e-mail choices are saved.');
  });
});
