import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import type { ExerciseDto } from '../../../../../policies/dto';
import { setCsrfToken } from '../../../lib/api-client';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { ExerciseForm } from './ExerciseForm';

// Team programming: the library's "use instead" list, chosen in the exercise form (at most six, in order).
const ORG = '11111111-1111-4111-8111-111111111111';
const uuid = (n: number) => `00000000-0000-4000-8000-${String(n).padStart(12, '0')}`;
const exercise = (n: number, name: string, more: Partial<ExerciseDto> = {}): ExerciseDto => ({
  id: uuid(n),
  name,
  patterns: [],
  equipment: 'machine',
  ballistic: false,
  steps: { kind: 'increment', step: 2.5, unit: 'kg' },
  referenceId: null,
  useInstead: [],
  archived: false,
  version: 1,
  ...more,
});
const sprint = exercise(1, 'Sprint 20 m', { patterns: ['sprint'], ballistic: true, equipment: 'bodyweight', useInstead: [uuid(2)] });
const bike = exercise(2, 'Bike intervals');
const arm = exercise(3, 'Arm bike intervals');
const rower = exercise(4, 'Rowing machine intervals');
const old = exercise(5, 'Old erg', { archived: true });
const more = [6, 7, 8, 9].map((n) => exercise(n, `Piece ${n}`));
const library = [sprint, bike, arm, rower, old, ...more];

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => {
  vi.stubGlobal('fetch', fetchMock);
  setCsrfToken('token-1');
});
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

function renderForm(onDone = vi.fn()) {
  renderWithProviders(<ExerciseForm orgId={ORG} exercise={sprint} library={library} onDone={onDone} onCancel={vi.fn()} />);
  return onDone;
}
const picker = () => screen.getByRole('group', { name: 'Use instead' });
const chosen = () =>
  within(picker())
    .queryAllByRole('listitem')
    .map((li) => li.textContent?.replace(/↑ Up|Remove/g, '').trim());
const add = (name: string) => {
  fireEvent.change(within(picker()).getByLabelText('Add an exercise to use instead'), {
    target: { value: library.find((e) => e.name === name)!.id },
  });
  fireEvent.click(within(picker()).getByRole('button', { name: 'Add' }));
};

// The whole form re-renders on each click; on a busy two-core machine that passed 5 s.
describe('the "Use instead" picker in the exercise form', { timeout: 15_000 }, () => {
  it('adds, moves up and removes, in order, and saves the ids in that order', async () => {
    fetchMock.mockImplementation(async (_input, init) => jsonResponse(200, { ...sprint, ...JSON.parse(String(init!.body)), version: 2 }));
    const onDone = renderForm();
    expect(picker()).toHaveAccessibleDescription(/tries these first, in this order\. Up to 6/);
    expect(chosen()).toEqual(['1.Bike intervals']);
    // Neither the exercise itself, nor an archived one, nor one already chosen is offered.
    const offered = within(within(picker()).getByLabelText('Add an exercise to use instead'))
      .getAllByRole('option')
      .map((o) => o.textContent);
    expect(offered).not.toContain('Sprint 20 m');
    expect(offered).not.toContain('Old erg');
    expect(offered).not.toContain('Bike intervals');

    add('Arm bike intervals');
    add('Rowing machine intervals');
    expect(chosen()).toEqual(['1.Bike intervals', '2.Arm bike intervals', '3.Rowing machine intervals']);
    fireEvent.click(screen.getByRole('button', { name: 'Move Rowing machine intervals up' }));
    expect(chosen()).toEqual(['1.Bike intervals', '2.Rowing machine intervals', '3.Arm bike intervals']);
    expect(screen.getByRole('button', { name: 'Move Bike intervals up' })).toBeDisabled();
    fireEvent.click(screen.getByRole('button', { name: 'Remove Bike intervals from use instead' }));
    expect(chosen()).toEqual(['1.Rowing machine intervals', '2.Arm bike intervals']);

    fireEvent.click(screen.getByRole('button', { name: 'Save exercise' }));
    await waitFor(() => expect(onDone).toHaveBeenCalled());
    const [url, init] = fetchMock.mock.calls[0];
    expect(String(url)).toContain(`/orgs/${ORG}/exercises/${sprint.id}`);
    expect(init?.method).toBe('PATCH');
    expect(JSON.parse(String(init!.body))).toMatchObject({ useInstead: [rower.id, arm.id], version: 1 });
  });

  it('stops at six: the list is full and nothing more can be added', () => {
    renderForm();
    for (const name of ['Arm bike intervals', 'Rowing machine intervals', 'Piece 6', 'Piece 7', 'Piece 8']) add(name);
    expect(chosen()).toHaveLength(6);
    const select = within(picker()).getByLabelText('Add an exercise to use instead');
    expect(select).toBeDisabled();
    expect(within(select).getByRole('option', { name: 'Already 6 chosen' })).toBeInTheDocument();
    expect(within(picker()).getByRole('button', { name: 'Add' })).toBeDisabled();
  });

  it("shows the server's field error on the picker, as an alert tied to it", async () => {
    fetchMock.mockResolvedValue(
      jsonResponse(400, {
        error: {
          code: 'validation_failed',
          message: 'Please check the form: useInstead must name exercises of this library.',
          fields: { useInstead: ['must name exercises of this library'] },
        },
        requestId: 'r1',
      }),
    );
    const onDone = renderForm();
    fireEvent.click(screen.getByRole('button', { name: 'Save exercise' }));
    const alert = await within(picker()).findByRole('alert');
    expect(alert).toHaveTextContent('Use instead must name exercises of this library');
    expect(picker()).toHaveAccessibleDescription(/must name exercises of this library/);
    expect(onDone).not.toHaveBeenCalled();
  });
});
