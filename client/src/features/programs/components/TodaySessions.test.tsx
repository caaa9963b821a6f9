import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { render, screen } from '@testing-library/react';
import type { ReactNode } from 'react';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import type { ExerciseDto, MembershipSummaryDto, TodayDto, UserDto } from '../../../../../policies/dto';
import { MembershipContext } from '../../../lib/membership-context';
import { jsonResponse } from '../../../test/render';
import { PlateHelper } from './PlateHelper';
import { TodaySessions } from './TodaySessions';

const ORG = '11111111-1111-4111-8111-111111111111';
const SAM = '22222222-2222-4222-8222-222222222222';
const SQUAT = '33333333-3333-4333-8333-333333333333';

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => vi.stubGlobal('fetch', fetchMock));
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

describe('PlateHelper', () => {
  // IWF competition discs 25…0.5 kg on a 20 kg men's bar (IWF Technical and Competition Rules,
  // secondary source); no collars counted: (70 − 20) / 2 = 25 kg a side.
  it('loads 70 kg as one 25 kg plate per side on a 20 kg bar, no collars', () => {
    render(<PlateHelper loadKg={70} unit="kg" />);
    expect(screen.getByText(/On a 20 kg bar, each side:/)).toBeInTheDocument();
    expect(screen.getByText('25 kg')).toBeInTheDocument();
  });

  it('uses lb plates on a 45 lb bar for a lb user (225 lb = 45 + 2 × 90)', () => {
    // 225 lb = 102.05828325 kg exactly (NIST SP 811: 1 lb = 0.45359237 kg).
    render(<PlateHelper loadKg={225 * 0.45359237} unit="lb" />);
    expect(screen.getByText('45 + 45 lb')).toBeInTheDocument();
  });
});

function renderToday(today: TodayDto, library: ExerciseDto[]) {
  fetchMock.mockImplementation(async (input) => {
    const path = String(input);
    if (path.includes('/today')) return jsonResponse(200, today);
    if (path.includes('/exercises')) return jsonResponse(200, library);
    return jsonResponse(404, { error: { code: 'not_found', message: 'No' }, requestId: 'r' });
  });
  const user: UserDto = { id: 'u1', email: 'sam@x.test', displayName: 'Sam Whitfield', unitPref: 'kg' };
  const membership = {
    id: SAM,
    organizationId: ORG,
    organizationName: 'Harbor Point',
    roles: ['athlete'],
  } as unknown as MembershipSummaryDto;
  const client = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  const wrap = (ui: ReactNode) => (
    <QueryClientProvider client={client}>
      <MembershipContext.Provider value={{ user, membership, orgId: ORG }}>{ui}</MembershipContext.Provider>
    </QueryClientProvider>
  );
  return render(wrap(<TodaySessions athleteId={SAM} />));
}

const squat: ExerciseDto = {
  id: SQUAT,
  name: 'Back squat',
  patterns: ['squat'],
  equipment: 'barbell',
  ballistic: false,
  steps: { kind: 'increment', step: 2.5, unit: 'kg' },
  referenceId: null,
  useInstead: [],
  archived: false,
  version: 1,
};

function todayWith(onHold: boolean): TodayDto {
  return {
    athleteId: SAM,
    date: '2027-01-05',
    unit: 'kg',
    sessions: [
      {
        id: 's1',
        programId: 'p1',
        programName: 'Return block',
        date: '2027-01-05',
        title: 'Lower A',
        status: 'published',
        publishedAt: '2027-01-01T09:00:00.000Z',
        version: 2,
        holds: [],
        onHold,
        exerciseNames: { [SQUAT]: 'Back squat' },
        loadsKg: { set1: 70, set2: 70 },
        content: {
          exercises: [
            {
              id: 'e1',
              exerciseId: SQUAT,
              sets: [
                { id: 'set1', reps: 5, load: { kind: 'kg', value: 70 }, targetRpe: 6, restSeconds: 120 },
                { id: 'set2', reps: 5, load: { kind: 'kg', value: 70 }, targetRpe: 6, restSeconds: 120 },
              ],
            },
          ],
        },
      },
    ],
  };
}

describe('TodaySessions', () => {
  it("shows today's published session in the athlete's unit, with the plates once per load", async () => {
    renderToday(todayWith(false), [squat]);
    expect(screen.getByRole('heading', { name: "Today's session" })).toBeInTheDocument();
    expect(await screen.findByText('Back squat')).toBeInTheDocument();
    expect(screen.getAllByText(/70 kg × 5/)).toHaveLength(2);
    expect(await screen.findAllByText('25 kg')).toHaveLength(1);
  });

  it('shows a session on hold without any load', async () => {
    renderToday(todayWith(true), [squat]);
    expect(await screen.findByText('On hold until your coach updates it')).toBeInTheDocument();
    expect(screen.queryByText(/70 kg/)).not.toBeInTheDocument();
  });
});
