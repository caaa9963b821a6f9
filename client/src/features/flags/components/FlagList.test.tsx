import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import type { FlagDto } from '../../../../../policies/dto';
import { renderWithProviders } from '../../../test/render';
import { FlagList } from './FlagList';

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => vi.stubGlobal('fetch', fetchMock));
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

const flag = (over: Partial<FlagDto>): FlagDto => ({
  id: 'f1',
  athleteId: 'a1',
  athleteName: 'Maya Torres',
  kind: 'pain_rule',
  severity: 'routine',
  message: 'Pain during training was 6/10, above the ceiling of 5.',
  suggestedAction: 'reduce',
  createdAt: '2026-03-05T18:00:00.000Z',
  acknowledgedAt: null,
  acknowledgedByName: null,
  painReportId: null,
  ...over,
});

describe('FlagList', () => {
  it('names severity in a word with a shape, says what to do, and acknowledges a flag', async () => {
    fetchMock.mockResolvedValue(new Response(null, { status: 204 }));
    renderWithProviders(
      <FlagList
        orgId="org-1"
        caption="Flags"
        athleteHref={(id) => `/staff/athletes/${id}/workload`}
        flags={[
          flag({}),
          flag({
            id: 'f2',
            kind: 'red_flag_emergency',
            severity: 'emergency',
            message: 'Warning sign reported.',
            suggestedAction: null,
            acknowledgedAt: '2026-03-05T18:05:00.000Z',
            acknowledgedByName: 'Priya Raman',
          }),
        ]}
      />,
    );
    expect(screen.getByRole('img', { name: 'Emergency: needs action now' })).toBeInTheDocument();
    expect(screen.getByText('Make the next session lighter.')).toBeInTheDocument();
    expect(screen.getByText('Make sure the athlete is getting urgent medical care now.')).toBeInTheDocument();
    expect(screen.getAllByRole('link', { name: 'Maya Torres' })[0]).toHaveAttribute('href', '/staff/athletes/a1/workload');
    const button = screen.getByRole('button', { name: 'Acknowledge' });
    expect(button).toHaveAccessibleDescription(/above the ceiling of 5/);
    fireEvent.click(button);
    await waitFor(() => expect(fetchMock).toHaveBeenCalledTimes(1));
    expect(String(fetchMock.mock.calls[0][0])).toBe('/api/orgs/org-1/flags/f1/acknowledge');
  });

  it('a flag raised by a pain report links to the report, outside the text that describes its Acknowledge button', () => {
    renderWithProviders(
      <FlagList
        orgId="org-1"
        caption="Flags"
        athleteHref={(id) => `/staff/athletes/${id}/workload`}
        flags={[flag({ kind: 'pain_report', suggestedAction: null, painReportId: 'r9' }), flag({ id: 'f2' })]}
      />,
    );
    expect(screen.getAllByRole('link', { name: 'Read the report' }).map((a) => a.getAttribute('href'))).toEqual(['/pain-reports/r9']);
    expect(screen.getAllByRole('button', { name: 'Acknowledge' })[0]).not.toHaveAccessibleDescription(/Read the report/);
  });
});
