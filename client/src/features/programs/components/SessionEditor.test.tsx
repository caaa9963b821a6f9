import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, within } from '@testing-library/react';
import type { ExerciseDto, ProgramSessionDto } from '../../../../../policies/dto';
import { setCsrfToken } from '../../../lib/api-client';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import type { AthleteEngine } from './live-check';
import { SessionEditor } from './SessionEditor';

const ORG = '11111111-1111-4111-8111-111111111111';
const SAM = '22222222-2222-4222-8222-222222222222';
const DEADLIFT = '33333333-3333-4333-8333-333333333333';
const SESSION = '44444444-4444-4444-8444-444444444444';
const SET = '55555555-5555-4555-8555-555555555555';

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => {
  vi.stubGlobal('fetch', fetchMock);
  setCsrfToken('token-1');
  // The server's check of the saved session: nothing waived.
  fetchMock.mockImplementation(async () => jsonResponse(200, { results: [{ athleteId: SAM, breaches: [] }] }));
});
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

const deadlift: ExerciseDto = {
  id: DEADLIFT,
  name: 'Deadlift',
  patterns: ['hinge'],
  equipment: 'barbell',
  ballistic: false,
  steps: { kind: 'increment', step: 2.5, unit: 'kg' },
  referenceId: null,
  useInstead: [],
  archived: false,
  version: 1,
};

const session: ProgramSessionDto = {
  id: SESSION,
  programId: 'p1',
  programName: 'Return block',
  date: '2027-01-05',
  title: 'Day 1',
  status: 'draft',
  publishedAt: null,
  version: 1,
  holds: [],
  content: {
    exercises: [
      {
        id: 'e1e1e1e1-0000-4000-8000-000000000001',
        exerciseId: DEADLIFT,
        sets: [{ id: SET, reps: 5, load: { kind: 'kg', value: 80 }, targetRpe: 6 }],
      },
    ],
  },
};

// Hinge capped at 60% of a tested 140 kg deadlift: 84 kg (the server's smoke test uses the same case).
const sam: AthleteEngine = {
  athleteId: SAM,
  athleteName: 'Sam Whitfield',
  status: 'limited',
  oneRms: { [DEADLIFT]: 140 },
  published: [],
  plans: [
    {
      planId: 'plan-1',
      caseId: 'case-1',
      version: 1,
      stages: [
        {
          id: 'stage-1',
          startDate: '2026-11-20',
          endDate: '2027-02-28',
          painCeiling: 5,
          patterns: { hinge: { mode: 'capped', caps: { maxPercent1RM: 60 } } },
        },
      ],
    },
  ],
};

function renderEditor() {
  return renderWithProviders(
    <SessionEditor
      orgId={ORG}
      unit="kg"
      athletes={[{ id: SAM, name: 'Sam Whitfield' }]}
      session={session}
      library={[deadlift]}
      engines={[sam]}
      exceptions={[]}
      onReload={async () => null}
      onDeleted={vi.fn()}
    />,
  );
}

const setOne = () => screen.getByRole('group', { name: 'Set 1 of Deadlift' });

describe('SessionEditor live check', () => {
  it('shows a breach as soon as a load over the cap is typed, and clears it with the one-click fix', () => {
    renderEditor();
    expect(within(setOne()).queryByRole('list', { name: 'Over a limit' })).not.toBeInTheDocument();

    fireEvent.change(within(setOne()).getByLabelText('Load'), { target: { value: '87.5' } });

    const breaches = within(setOne()).getByRole('list', { name: 'Over a limit' });
    const item = within(breaches).getByRole('listitem');
    expect(item).toHaveTextContent('Hinge: max 60% of 140 kg = 84 kg: planned 87.5 kg; 82.5 kg fits on 2.5 kg increments.');
    // What is over which limit, first, in the coach's words.
    expect(item).toHaveTextContent('Deadlift 87.5 kg × 5 is over the 84 kg limit (60% of 140 kg) for hinging.');
    expect(screen.queryByRole('alert')).not.toBeInTheDocument();
    // The line: bar at the planned load, past the 84 kg cap.
    expect(within(setOne()).getByRole('meter')).toHaveAttribute('aria-valuetext', '87.5 kg, over the line by 3.5 kg (limit 84 kg)');

    fireEvent.click(within(setOne()).getByRole('button', { name: 'Use 82.5 kg' }));

    expect(within(setOne()).getByLabelText('Load')).toHaveValue('82.5');
    expect(within(setOne()).getByLabelText('Load unit')).toHaveValue('kg');
    expect(within(setOne()).queryByRole('list', { name: 'Over a limit' })).not.toBeInTheDocument();
  });

  it('keeps Publish off while an unwaived breach shows', () => {
    renderEditor();
    const publish = screen.getByRole('button', { name: 'Publish' });
    expect(publish).toBeEnabled();

    fireEvent.change(within(setOne()).getByLabelText('Load unit'), { target: { value: 'percent' } });
    fireEvent.change(within(setOne()).getByLabelText('Load'), { target: { value: '65' } });
    expect(within(setOne()).getByRole('list', { name: 'Over a limit' })).toHaveTextContent('max 60% of 140 kg = 84 kg: planned 91 kg');
    expect(publish).toBeDisabled();
    expect(screen.getByText(/1 set is over a limit \(1 limit crossed\)/)).toBeInTheDocument();

    fireEvent.click(within(setOne()).getByRole('button', { name: 'Use 82.5 kg' }));
    expect(publish).toBeEnabled();
  });

  it("shows the server's own breach list when it still refuses to publish", async () => {
    const serverBreach = {
      setId: SET,
      sessionId: SESSION,
      date: '2027-01-05',
      exerciseId: DEADLIFT,
      rule: 'percent_1rm',
      pattern: 'hinge',
      limit: 'max 50% of 140 kg = 70 kg',
      planned: '80 kg',
      fits: '70 kg fits on 2.5 kg increments',
      fittingKg: 70,
      waived: false,
      message: 'Hinge: max 50% of 140 kg = 70 kg: planned 80 kg; 70 kg fits on 2.5 kg increments.',
    };
    let published = false;
    fetchMock.mockImplementation(async (input) => {
      const path = String(input);
      if (path.endsWith('/publish')) {
        published = true;
        return jsonResponse(422, {
          error: {
            code: 'unprocessable',
            message: 'This session cannot be published: 1 planned set goes past a cap.',
            details: { breaches: [{ athleteId: SAM, breaches: [serverBreach] }] },
          },
          requestId: 'r1',
        });
      }
      // Before publishing nothing is waived; afterwards the server's check finds what its publish refused.
      return jsonResponse(200, { results: [{ athleteId: SAM, breaches: published ? [serverBreach] : [] }] });
    });
    renderEditor();
    fireEvent.click(screen.getByRole('button', { name: 'Publish' }));

    const list = await screen.findByRole('list', { name: 'Over a limit, as the server checked, for Sam Whitfield' });
    expect(list).toHaveTextContent('Hinge: max 50% of 140 kg = 70 kg: planned 80 kg; 70 kg fits on 2.5 kg increments.');
    expect(screen.getByRole('alert')).toHaveTextContent('This session cannot be published: 1 planned set goes past a cap.');
  });
});
