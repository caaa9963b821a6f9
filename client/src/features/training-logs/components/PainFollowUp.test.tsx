import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import type { TrainingLogDto } from '../../../../../policies/dto';
import { setOrgTimeZone } from '../../../lib/dates';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { NextMorningPrompt, pendingEvening, pendingNextMorning } from './NextMorningPrompt';
import { TrainingLogForm } from './TrainingLogForm';

const ATHLETE = '22222222-2222-4222-8222-222222222222';
const fetchMock = vi.fn<typeof fetch>();

const logOn = (date: string, over: Partial<TrainingLogDto> = {}): TrainingLogDto => ({
  id: `l-${date}`,
  athleteId: ATHLETE,
  date,
  durationMinutes: 60,
  sessionRpe: 5,
  sessionLoad: 300,
  painBefore: 1,
  painDuring: 3,
  painAfter: null,
  painNextMorning: null,
  painCeiling: 5,
  sets: [],
  notes: null,
  sessionId: null,
  version: 1,
  ...over,
});

beforeEach(() => vi.stubGlobal('fetch', fetchMock));
afterEach(() => {
  vi.unstubAllGlobals();
  vi.useRealTimers();
  fetchMock.mockReset();
  setOrgTimeZone(null);
});

describe('which follow-up question shows (Silbernagel et al. 2007: pain that evening, then the next morning)', () => {
  it('the next-morning question is for yesterday’s session only, never today’s', () => {
    expect(pendingNextMorning([logOn('2026-01-14')], '2026-01-14')).toBeNull();
    expect(pendingNextMorning([logOn('2026-01-14')], '2026-01-15')?.id).toBe('l-2026-01-14');
    expect(pendingNextMorning([logOn('2026-01-14', { painNextMorning: 1 })], '2026-01-15')).toBeNull();
  });

  it('the evening question is for today’s session without an evening score', () => {
    expect(pendingEvening([logOn('2026-01-14')], '2026-01-14')?.id).toBe('l-2026-01-14');
    expect(pendingEvening([logOn('2026-01-14', { painAfter: 2 })], '2026-01-14')).toBeNull();
    expect(pendingEvening([logOn('2026-01-13')], '2026-01-14')).toBeNull();
  });

  it('Los Angeles at 23:30 (already the next day in UTC): the evening question shows, the morning one does not', async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(new Date('2026-01-15T07:30:00Z'));
    setOrgTimeZone('America/Los_Angeles');
    fetchMock.mockImplementation(async () => jsonResponse(200, [logOn('2026-01-14')]));
    renderWithProviders(<NextMorningPrompt orgId="org-1" athleteId={ATHLETE} />);
    expect(await screen.findByRole('heading', { name: 'How is the pain now, after your session?' })).toBeInTheDocument();
    expect(screen.queryByRole('heading', { name: 'How is the pain this morning?' })).toBeNull();

    fetchMock.mockImplementation(async (_url, init) =>
      init?.method === 'POST'
        ? jsonResponse(200, {
            log: logOn('2026-01-14', { painAfter: 4, version: 2 }),
            painRule: { action: 'keep', flags: [], athleteMessage: 'Pain stayed within your limits. Keep going as planned.' },
          })
        : jsonResponse(200, [logOn('2026-01-14', { painAfter: 4, version: 2 })]),
    );
    fireEvent.click(screen.getByRole('button', { name: 'Pain after the session 4' }));
    expect(await screen.findByRole('heading', { name: 'Thanks — pain after your session: 4/10' })).toBeInTheDocument();
    const post = fetchMock.mock.calls.find(([, init]) => init?.method === 'POST')!;
    expect(post[0]).toBe('/api/orgs/org-1/training-logs/l-2026-01-14/after');
    expect(JSON.parse(String(post[1]?.body))).toEqual({ painAfter: 4, version: 1 });
  });
});

describe('the log form’s evening pain', () => {
  it('is optional, sent when picked, and can be cleared to answer later', async () => {
    fetchMock.mockImplementation(async (_url, init) => {
      const body = JSON.parse(init?.body as string);
      return jsonResponse(201, {
        log: { ...logOn(body.date), ...body },
        painRule: { action: 'keep', flags: [], athleteMessage: 'Pain stayed within your limits. Keep going as planned.' },
      });
    });
    renderWithProviders(<TrainingLogForm orgId="org-1" athleteId={ATHLETE} unit="kg" onSaved={() => {}} />);
    fireEvent.change(screen.getByLabelText('Duration (minutes)'), { target: { value: '60' } });
    fireEvent.change(screen.getByLabelText('Session effort (0–10)'), { target: { value: '5' } });
    fireEvent.click(screen.getByRole('radio', { name: 'Pain before 1' }));
    fireEvent.click(screen.getByRole('radio', { name: 'Pain during 3' }));
    fireEvent.click(screen.getByRole('radio', { name: 'Pain after the session (this evening) 6' }));
    fireEvent.click(screen.getByRole('button', { name: 'Save session' }));
    await waitFor(() => expect(fetchMock).toHaveBeenCalledTimes(1));
    expect(JSON.parse(String(fetchMock.mock.calls[0][1]?.body))).toMatchObject({ painDuring: 3, painAfter: 6 });
  });

  it('cleared, it is left out of the request', async () => {
    fetchMock.mockImplementation(async () => jsonResponse(500, {}));
    renderWithProviders(<TrainingLogForm orgId="org-1" athleteId={ATHLETE} unit="kg" onSaved={() => {}} />);
    fireEvent.change(screen.getByLabelText('Duration (minutes)'), { target: { value: '60' } });
    fireEvent.change(screen.getByLabelText('Session effort (0–10)'), { target: { value: '5' } });
    fireEvent.click(screen.getByRole('radio', { name: 'Pain before 1' }));
    fireEvent.click(screen.getByRole('radio', { name: 'Pain during 3' }));
    fireEvent.click(screen.getByRole('radio', { name: 'Pain after the session (this evening) 6' }));
    fireEvent.click(screen.getByRole('button', { name: 'Clear pain after — answer it later' }));
    fireEvent.click(screen.getByRole('button', { name: 'Save session' }));
    await waitFor(() => expect(fetchMock).toHaveBeenCalledTimes(1));
    expect(JSON.parse(String(fetchMock.mock.calls[0][1]?.body))).not.toHaveProperty('painAfter');
  });
});
