import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import type { ExerciseDto, ProgramSessionDto } from '../../../../../policies/dto';
import { setCsrfToken } from '../../../lib/api-client';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { SessionEditor } from './SessionEditor';
import { SetSchemeEntry } from './SetSchemeEntry';
import { schemeToSetForms, type SetForm } from './session-form';

// The grammar is ours (policies/load/set-scheme.ts, quick set entry); these check the editor's side of it.
const ORG = '11111111-1111-4111-8111-111111111111';
const SAM = '22222222-2222-4222-8222-222222222222';
const SQUAT = '33333333-3333-4333-8333-333333333333';
const SESSION = '44444444-4444-4444-8444-444444444444';
const FIRST = '55555555-5555-4555-8555-555555555555';
const SECOND = '66666666-6666-4666-8666-666666666666';

describe('schemeToSetForms', () => {
  const old: SetForm[] = [
    { setId: FIRST, reps: '10', load: '40', loadUnit: 'kg', targetRpe: '', rest: '90', notes: 'easy', warmUp: true },
    { setId: SECOND, reps: '5', load: '80', loadUnit: 'kg', targetRpe: '8', rest: '180', notes: '', warmUp: false },
  ];

  it('maps each load kind into the form shape, keeping set ids and rest by place', () => {
    const sets = schemeToSetForms(
      [
        { reps: 5, load: { kind: 'percent', value: 75 }, targetRpe: null },
        { reps: 8, load: { kind: 'bodyweight' }, targetRpe: 7 },
        { reps: 3, load: { kind: 'lb', value: 225.5 }, targetRpe: 8.5 },
      ],
      old,
    );
    expect(sets).toEqual([
      { setId: FIRST, reps: '5', load: '75', loadUnit: 'percent', targetRpe: '', rest: '90', notes: '', warmUp: false },
      { setId: SECOND, reps: '8', load: '', loadUnit: 'bodyweight', targetRpe: '7', rest: '180', notes: '', warmUp: false },
      { setId: expect.any(String), reps: '3', load: '225.5', loadUnit: 'lb', targetRpe: '8.5', rest: '180', notes: '', warmUp: false },
    ]);
    expect(sets[2].setId).not.toBe(FIRST);
    expect(sets[2].setId).not.toBe(SECOND);
  });
});

describe('SetSchemeEntry on its own', () => {
  it('has a label, help text with two examples, and hands over the parsed sets on Enter', () => {
    const onUse = vi.fn();
    render(<SetSchemeEntry exerciseName="Back squat" onUse={onUse} />);
    const box = screen.getByLabelText('Sets (quick entry)');
    expect(box).toHaveAccessibleDescription(/3 x 5 @ 75 %.*4 x 8 @ RPE 7/);
    fireEvent.change(box, { target: { value: '4 x 8 @ RPE 7' } });
    fireEvent.keyDown(box, { key: 'Enter' });
    expect(onUse).toHaveBeenCalledWith(Array.from({ length: 4 }, () => ({ reps: 8, load: { kind: 'bodyweight' }, targetRpe: 7 })));
    expect(box).toHaveValue('');
    expect(screen.getByRole('status')).toHaveTextContent('Back squat now has 4 sets.');
  });

  it('bad input: the parser message and the character where it failed, as an alert tied to the box; nothing is used', () => {
    const onUse = vi.fn();
    render(<SetSchemeEntry exerciseName="Back squat" onUse={onUse} />);
    const box = screen.getByLabelText('Sets (quick entry)');
    fireEvent.change(box, { target: { value: '3 x 5 @ 75' } });
    fireEvent.click(screen.getByRole('button', { name: 'Use these sets for Back squat' }));
    expect(onUse).not.toHaveBeenCalled();
    const alert = screen.getByRole('alert');
    // "3 x 5 @ 75" — the unit is missing at the end, index 10, the 11th character.
    expect(alert).toHaveTextContent('at character 11');
    expect(alert).toHaveTextContent('expected a unit: "%", "kg" or "lb"');
    expect(box).toHaveAttribute('aria-invalid', 'true');
    expect(box).toHaveAccessibleDescription(/at character 11/);
    expect(box).toHaveValue('3 x 5 @ 75');
    expect((box as HTMLInputElement).selectionStart).toBe(10);

    fireEvent.change(box, { target: { value: '3 x 5 @ 75 %' } });
    fireEvent.keyDown(box, { key: 'Enter' });
    expect(onUse).toHaveBeenCalledTimes(1);
    expect(screen.queryByRole('alert')).not.toBeInTheDocument();
    expect(box).not.toHaveAttribute('aria-invalid');
  });
});

// The whole session editor renders and checks live; give it room on a busy machine.
describe('quick entry in the session editor', { timeout: 15_000 }, () => {
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
  const session: ProgramSessionDto = {
    id: SESSION,
    programId: 'p1',
    programName: 'Block',
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
          exerciseId: SQUAT,
          sets: [
            { id: FIRST, reps: 10, load: { kind: 'kg', value: 40 }, targetRpe: null, restSeconds: 120 },
            { id: SECOND, reps: 5, load: { kind: 'kg', value: 80 }, targetRpe: 8, restSeconds: 120 },
          ],
        },
      ],
    },
  };

  it('Enter replaces the exercise sets (without submitting the session), and Save sends them', async () => {
    renderWithProviders(
      <SessionEditor
        orgId={ORG}
        unit="kg"
        athletes={[{ id: SAM, name: 'Sam Whitfield' }]}
        session={session}
        library={[squat]}
        engines={[]}
        exceptions={[]}
        onReload={async () => null}
        onDeleted={vi.fn()}
      />,
    );
    const box = screen.getByLabelText('Sets (quick entry)');
    fireEvent.change(box, { target: { value: '1 x 5 @ 60 %, 3 x 5 @ 75 % @ RPE 8' } });
    fireEvent.keyDown(box, { key: 'Enter' });

    const set = (n: number) => screen.getByRole('group', { name: `Set ${n} of Back squat` });
    expect(screen.getAllByRole('group', { name: /^Set \d of Back squat$/ })).toHaveLength(4);
    expect(within(set(1)).getByLabelText('Load')).toHaveValue('60');
    expect(within(set(1)).getByLabelText('Load unit')).toHaveValue('percent');
    expect(within(set(4)).getByLabelText('Target RPE')).toHaveValue('8');
    expect(fetchMock.mock.calls.some(([, init]) => init?.method === 'PUT')).toBe(false);

    fireEvent.click(screen.getByRole('button', { name: 'Save draft' }));
    await waitFor(() => expect(fetchMock.mock.calls.some(([, init]) => init?.method === 'PUT')).toBe(true));
    const [, init] = fetchMock.mock.calls.find(([, i]) => i?.method === 'PUT')!;
    const sets = JSON.parse(String(init!.body)).content.exercises[0].sets;
    expect(sets).toHaveLength(4);
    expect(sets[0]).toMatchObject({ id: FIRST, reps: 5, load: { kind: 'percent', value: 60 }, targetRpe: null, restSeconds: 120 });
    expect(sets[1]).toMatchObject({ id: SECOND, reps: 5, load: { kind: 'percent', value: 75 }, targetRpe: 8 });
    expect(sets[3]).toMatchObject({ reps: 5, load: { kind: 'percent', value: 75 }, targetRpe: 8, restSeconds: 120 });
  });
});
