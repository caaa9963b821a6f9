import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { screen } from '@testing-library/react';
import type { AthleteWeekDto } from '../../../../../policies/dto';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { ComingWeek } from './ComingWeek';

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => vi.stubGlobal('fetch', fetchMock));
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

const limits = { headline: 'Limited: some movements have limits.', mayNot: [], withLimits: [], free: null, pain: null };
const day = (date: string, stages: AthleteWeekDto['days'][number]['stages']): AthleteWeekDto['days'][number] => ({
  date,
  status: 'limited',
  stages,
  painCeiling: 4,
  limits,
  sessions: [],
});
const first = { label: 'Stage 1', startDate: '2026-12-01', endDate: '2026-12-09' };
const second = { label: 'Stage 2', startDate: '2026-12-10', endDate: '2026-12-30' };
const WEEK: AthleteWeekDto = {
  athleteId: 'a1',
  from: '2026-12-08',
  to: '2026-12-10',
  unit: 'kg',
  days: [
    day('2026-12-08', [first]),
    day('2026-12-09', [first]),
    { ...day('2026-12-10', [second]), limits: { ...limits, withLimits: ['Hinge: up to 60 kg'] } },
  ],
};

describe('the coming week', () => {
  it('a day a new stage starts says it is the plan’s date, and that the clinician may keep the athlete at the stage before', async () => {
    fetchMock.mockResolvedValue(jsonResponse(200, WEEK));
    renderWithProviders(<ComingWeek orgId="o1" athleteId="a1" today="2026-12-08" logHref={() => '/log'} loggedSessionIds={new Set()} />);
    const days = await screen.findAllByRole('listitem', { name: /Dec/ });
    expect(days).toHaveLength(3);
    const note = /A new stage of your plan starts on this day, as planned\. Your clinician may keep you at the stage before/;
    expect(days[2]).toHaveTextContent(note);
    expect(days[0]).not.toHaveTextContent(note);
    expect(days[1]).not.toHaveTextContent(note);
  });

  it('a day with the same limits as the day before says so instead of repeating them all', async () => {
    fetchMock.mockResolvedValue(jsonResponse(200, WEEK));
    renderWithProviders(<ComingWeek orgId="o1" athleteId="a1" today="2026-12-08" logHref={() => '/log'} loggedSessionIds={new Set()} />);
    const days = await screen.findAllByRole('listitem', { name: /Dec/ });
    expect(days[0]).not.toHaveTextContent('The same limits as the day before.');
    expect(days[1]).toHaveTextContent('The same limits as the day before.');
    expect(days[2]).not.toHaveTextContent('The same limits as the day before.');
    expect(days[2]).toHaveTextContent('Hinge: up to 60 kg');
  });
});
