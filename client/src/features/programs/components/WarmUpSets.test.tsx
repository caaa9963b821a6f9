import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import type { ExerciseDto, ProgramSessionDto } from '../../../../../policies/dto';
import { HARD_SET_DEFINITION } from '../../../../../policies/load/compliance';
import { setCsrfToken } from '../../../lib/api-client';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import type { AthleteEngine } from './live-check';
import { SessionEditor } from './SessionEditor';

// "Hard set" = RPE 7 or higher, 3 or fewer reps in reserve (common practice); warm-ups are the coach's mark.
const ORG = '11111111-1111-4111-8111-111111111111';
const SAM = '22222222-2222-4222-8222-222222222222';
const DEADLIFT = '33333333-3333-4333-8333-333333333333';
const SESSION = '44444444-4444-4444-8444-444444444444';
const WARM = '55555555-5555-4555-8555-555555555555';
const WORK = '66666666-6666-4666-8666-666666666666';

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => {
  vi.stubGlobal('fetch', fetchMock);
  setCsrfToken('token-1');
  fetchMock.mockImplementation(async (_input, init) =>
    init?.method === 'PUT'
      ? jsonResponse(200, { ...session, version: 2, content: JSON.parse(String(init.body)).content })
      : jsonResponse(200, { results: [{ athleteId: SAM, breaches: [] }] }),
  );
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

// An empty bar for 10 with no target RPE and no baseline (its effort cannot be known), then one working set at RPE 8.
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
        sets: [
          { id: WARM, reps: 10, load: { kind: 'kg', value: 20 }, targetRpe: null },
          { id: WORK, reps: 5, load: { kind: 'kg', value: 80 }, targetRpe: 8 },
        ],
      },
    ],
  },
};

// The clinician allows one hard hinge set a week.
const sam: AthleteEngine = {
  athleteId: SAM,
  athleteName: 'Sam Whitfield',
  status: 'limited',
  oneRms: {},
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
          patterns: { hinge: { mode: 'capped', caps: { maxHardSetsPerWeek: 1 } } },
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

const setRow = (n: number) => screen.getByRole('group', { name: `Set ${n} of Deadlift` });

describe('warm-up sets in the program builder', () => {
  it('states what a hard set is on screen, and each warm-up box is described by it', () => {
    renderEditor();
    expect(screen.getByText(HARD_SET_DEFINITION)).toBeVisible();
    expect(HARD_SET_DEFINITION).toMatch(/RPE 7 or higher \(3 or fewer reps in reserve\) — common practice/);
    const box = within(setRow(1)).getByRole('checkbox', { name: 'Warm-up' });
    expect(box).not.toBeChecked();
    expect(box).toHaveAccessibleDescription(HARD_SET_DEFINITION);
  });

  it('marking the first set as a warm-up takes it out of the weekly hard-set count, and the breach on the working set clears', () => {
    renderEditor();
    // Unmarked, the first set's unknown effort counts as hard: the RPE 8 set is hard set 2 of a limit of 1.
    expect(within(setRow(2)).getByRole('list', { name: 'Over a limit' })).toHaveTextContent('max 1 hard sets (RPE 7+)');
    expect(screen.getByRole('button', { name: 'Publish' })).toBeDisabled();

    fireEvent.click(within(setRow(1)).getByRole('checkbox', { name: 'Warm-up' }));

    expect(within(setRow(2)).queryByRole('list', { name: 'Over a limit' })).not.toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Publish' })).toBeEnabled();
  });

  it('a warm-up planned at RPE 8 is still a hard set', () => {
    renderEditor();
    fireEvent.click(within(setRow(1)).getByRole('checkbox', { name: 'Warm-up' }));
    fireEvent.change(within(setRow(1)).getByLabelText('Target RPE'), { target: { value: '8' } });
    expect(within(setRow(2)).getByRole('list', { name: 'Over a limit' })).toHaveTextContent('this is hard set 2');
  });

  it('saves the mark on the set (only on the marked one), and a set added after it is a working set', async () => {
    renderEditor();
    fireEvent.click(within(setRow(1)).getByRole('checkbox', { name: 'Warm-up' }));
    fireEvent.click(screen.getByRole('button', { name: 'Add a set to Deadlift' }));
    expect(within(setRow(3)).getByRole('checkbox', { name: 'Warm-up' })).not.toBeChecked();
    fireEvent.click(screen.getByRole('button', { name: 'Save draft' }));

    await waitFor(() => expect(fetchMock.mock.calls.some(([, init]) => init?.method === 'PUT')).toBe(true));
    const [, init] = fetchMock.mock.calls.find(([, i]) => i?.method === 'PUT')!;
    const sets = JSON.parse(String(init!.body)).content.exercises[0].sets;
    expect(sets.map((s: { id: string; warmUp?: boolean }) => s.warmUp)).toEqual([true, undefined, undefined]);
  });
});
