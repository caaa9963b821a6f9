import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { KG_PER_LB } from '../../../../../policies/load/units';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { TrainingLogForm } from './TrainingLogForm';

const ATHLETE = '22222222-2222-4222-8222-222222222222';
const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => vi.stubGlobal('fetch', fetchMock));
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

function fillSession({ effort = '5' }: { effort?: string } = {}) {
  fireEvent.change(screen.getByLabelText('Duration (minutes)'), { target: { value: '60' } });
  fireEvent.change(screen.getByLabelText('Session effort (0–10)'), { target: { value: effort } });
  fireEvent.click(screen.getByRole('radio', { name: 'Pain before 1' }));
  fireEvent.click(screen.getByRole('radio', { name: 'Pain during 3' }));
}

describe('TrainingLogForm', () => {
  it('refuses a session effort of 11 in words (Foster CR-10 stops at 10) and sends nothing', async () => {
    renderWithProviders(<TrainingLogForm orgId="org-1" athleteId={ATHLETE} unit="kg" onSaved={() => {}} />);
    fillSession({ effort: '11' });
    fireEvent.click(screen.getByRole('button', { name: 'Save session' }));
    expect(await screen.findByText('Session effort must be from 0 to 10')).toBeInTheDocument();
    expect(screen.getByLabelText('Session effort (0–10)')).toHaveAttribute('aria-invalid', 'true');
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('shows Foster’s words for the effort chosen', () => {
    renderWithProviders(<TrainingLogForm orgId="org-1" athleteId={ATHLETE} unit="kg" onSaved={() => {}} />);
    fireEvent.click(screen.getByRole('button', { name: '7 Very hard' }));
    expect(screen.getByLabelText('Session effort (0–10)')).toHaveValue(7);
    expect(screen.getByLabelText('Session effort (0–10)')).toHaveAccessibleDescription(expect.stringContaining('Very hard'));
  });

  it('every score 0–10 has a button, the ones without words on the scale too (6, 8, 9: Foster et al. 2001)', () => {
    renderWithProviders(<TrainingLogForm orgId="org-1" athleteId={ATHLETE} unit="kg" onSaved={() => {}} />);
    expect(within(screen.getByRole('list', { name: 'Effort scale' })).getAllByRole('button')).toHaveLength(11);
    fireEvent.click(screen.getByRole('button', { name: '8' }));
    expect(screen.getByLabelText('Session effort (0–10)')).toHaveValue(8);
    expect(screen.getByLabelText('Session effort (0–10)')).toHaveAccessibleDescription(expect.stringContaining('Between very hard and'));
  });

  it('sends a load typed in lb as kg, with the exact NIST factor (1 lb = 0.45359237 kg)', async () => {
    const onSaved = vi.fn();
    fetchMock.mockImplementation(async (_url, init) => {
      const body = JSON.parse(init?.body as string);
      return jsonResponse(201, {
        log: { ...body, id: 'l1', sessionLoad: 300, painNextMorning: null, painCeiling: 5, notes: null, version: 1 },
        painRule: { action: 'keep', flags: [], athleteMessage: 'Pain stayed within your limits. Keep going as planned.' },
      });
    });
    renderWithProviders(<TrainingLogForm orgId="org-1" athleteId={ATHLETE} unit="lb" onSaved={onSaved} />);
    fillSession();
    fireEvent.click(screen.getByRole('button', { name: 'Add a set' }));
    fireEvent.change(screen.getByLabelText('Exercise'), { target: { value: 'Trap-bar deadlift' } });
    fireEvent.change(screen.getByLabelText('Load'), { target: { value: '135' } });
    fireEvent.change(screen.getByLabelText('Reps'), { target: { value: '5' } });
    // A second set starts as a copy of the first; then remove it again.
    fireEvent.click(screen.getByRole('button', { name: 'Add a set' }));
    expect(screen.getAllByLabelText('Load')[1]).toHaveValue(135);
    fireEvent.click(screen.getByRole('button', { name: 'Remove set 2' }));
    fireEvent.click(screen.getByRole('button', { name: 'Save session' }));

    await waitFor(() => expect(fetchMock).toHaveBeenCalledTimes(1));
    const [url, init] = fetchMock.mock.calls[0];
    expect(url).toBe('/api/orgs/org-1/training-logs');
    const body = JSON.parse(init?.body as string);
    // 135 lb = 61.23496995 kg: the pound is 0.45359237 kg exactly (NIST Special Publication 811, appendix B).
    expect(body.sets).toEqual([{ exercise: 'Trap-bar deadlift', loadKg: 135 * KG_PER_LB, reps: 5, rpe: null }]);
    expect(body.sets[0].loadKg).toBeCloseTo(61.23496995, 8);
    expect(body).toMatchObject({ athleteId: ATHLETE, durationMinutes: 60, sessionRpe: 5, painBefore: 1, painDuring: 3 });
    await waitFor(() => expect(onSaved).toHaveBeenCalled());
  });
});
