import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import type { NotificationDto } from '../../../../../policies/dto';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { NoticeList } from './NoticeList';
import { NoticesLink } from './NoticesLink';

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => vi.stubGlobal('fetch', fetchMock));
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

const NOTICES: NotificationDto[] = [
  {
    id: 'n1',
    athleteId: 'a1',
    kind: 'red_flag_emergency',
    severity: 'emergency',
    title: 'Maya Torres reported a warning sign',
    body: 'She has been told to get urgent care and is set to Out.',
    createdAt: '2026-03-05T18:00:00.000Z',
    readAt: null,
    painReportId: null,
  },
  {
    id: 'n2',
    athleteId: 'a1',
    kind: 'pain_report',
    severity: 'routine',
    title: 'New pain report',
    body: 'Lower back, 4/10.',
    createdAt: '2026-03-04T18:00:00.000Z',
    readAt: '2026-03-04T19:00:00.000Z',
    painReportId: null,
  },
];

describe('notices', () => {
  it('keeps the header link named "Notices" and gives the unread count as its description', async () => {
    fetchMock.mockResolvedValue(jsonResponse(200, NOTICES));
    renderWithProviders(<NoticesLink orgId="org-1" />);
    const link = screen.getByRole('link', { name: 'Notices' });
    await waitFor(() => expect(link).toHaveAccessibleDescription('1 unread, including an emergency'));
  });

  it('shows severity in words and shapes, the emergency number as a dialling link, and marks all read', async () => {
    fetchMock.mockResolvedValue(new Response(null, { status: 204 }));
    renderWithProviders(<NoticeList orgId="org-1" notices={NOTICES} emergencyNumber="911" />);
    expect(screen.getByRole('img', { name: 'Emergency: needs action now' })).toBeInTheDocument();
    expect(screen.getByRole('img', { name: 'Routine: for your information' })).toBeInTheDocument();
    expect(screen.getByText('New')).toBeInTheDocument();
    expect(screen.getByRole('link', { name: '911' })).toHaveAttribute('href', 'tel:911');
    fireEvent.click(screen.getByRole('button', { name: 'Mark all read' }));
    await waitFor(() => expect(fetchMock).toHaveBeenCalledTimes(1));
    expect(String(fetchMock.mock.calls[0][0])).toBe('/api/orgs/org-1/notifications/read-all');
    expect(fetchMock.mock.calls[0][1]?.method).toBe('POST');
  });

  it('a notice sent with a pain report links to that report; others do not', () => {
    renderWithProviders(<NoticeList orgId="org-1" notices={[{ ...NOTICES[0], painReportId: 'r1' }, NOTICES[1]]} />);
    expect(screen.getAllByRole('link', { name: 'Read the report' }).map((a) => a.getAttribute('href'))).toEqual(['/pain-reports/r1']);
  });
});
