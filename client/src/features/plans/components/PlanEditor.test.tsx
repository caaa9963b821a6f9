import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import type { PlanDto } from '../../../../../policies/dto';
import { fromUnit } from '../../../../../policies/load/units';
import { setCsrfToken } from '../../../lib/api-client';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { PlanEditor } from './PlanEditor';

const ORG = '11111111-1111-4111-8111-111111111111';
const CASE = '22222222-2222-4222-8222-222222222222';
const PLAN = '33333333-3333-4333-8333-333333333333';
const STAGE = '44444444-4444-4444-8444-444444444444';

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => {
  vi.stubGlobal('fetch', fetchMock);
  setCsrfToken('token-1');
});
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

function planDto(version: number, guidance = 'Walk freely.'): PlanDto {
  return {
    id: PLAN,
    organizationId: ORG,
    caseId: CASE,
    athleteId: 'm-maya',
    version,
    canSeeHistory: true,
    current: {
      planId: PLAN,
      version,
      guidance,
      changeNote: null,
      createdAt: '2026-03-02T09:00:00.000Z',
      createdByName: 'Priya Raman',
      stages: [
        {
          id: STAGE,
          label: 'Protect',
          startDate: '2026-03-02',
          endDate: '2026-03-15',
          painCeiling: 4,
          patterns: { hinge: { mode: 'capped', caps: { maxPercent1RM: 60 } }, jump: { mode: 'blocked' } },
        },
      ],
    },
  };
}

function sentBodies(method: string) {
  return fetchMock.mock.calls.filter(([, init]) => init?.method === method).map(([, init]) => JSON.parse(String(init?.body)));
}

const stage = (n: number) => screen.getByRole('group', { name: `Stage ${n}` });

describe('PlanEditor', () => {
  it('refuses overlapping stages before anything is sent', async () => {
    renderWithProviders(<PlanEditor orgId={ORG} caseId={CASE} unit="kg" onSaved={vi.fn()} onCancel={vi.fn()} />);
    fireEvent.change(within(stage(1)).getByLabelText('Start date'), { target: { value: '2026-03-02' } });
    fireEvent.change(within(stage(1)).getByLabelText('End date'), { target: { value: '2026-03-15' } });
    fireEvent.click(screen.getByRole('button', { name: 'Add stage' }));
    // The new stage starts the day after stage 1 ends; pull it back into stage 1's days.
    expect(within(stage(2)).getByLabelText('Start date')).toHaveValue('2026-03-16');
    fireEvent.change(within(stage(2)).getByLabelText('Start date'), { target: { value: '2026-03-10' } });

    // Said as soon as the dates clash, before any save is tried.
    expect(within(stage(2)).getByText(/Start date overlaps stage 1 \(which ends Sun 15 Mar 2026\)/)).toBeInTheDocument();

    fireEvent.click(screen.getByRole('button', { name: 'Save plan' }));
    const summary = await screen.findByRole('alert');
    expect(summary).toHaveTextContent('Stage 2: Start date overlaps stage 1');
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('sends a max load typed in lb as kg, with the exact factor', async () => {
    fetchMock.mockImplementation(async () => jsonResponse(201, planDto(1)));
    const onSaved = vi.fn();
    renderWithProviders(<PlanEditor orgId={ORG} caseId={CASE} unit="lb" onSaved={onSaved} onCancel={vi.fn()} />);

    // A blank stage limits nothing; Hinge is brought in as Capped.
    fireEvent.change(within(stage(1)).getByLabelText('Add a limit for another movement'), { target: { value: 'hinge' } });
    fireEvent.click(within(stage(1)).getByRole('button', { name: 'Add limit' }));
    const hingeMode = within(stage(1)).getByRole('group', { name: 'Hinge mode' });
    expect(within(hingeMode).getByRole('radio', { name: 'Capped' })).toBeChecked();
    fireEvent.change(within(stage(1)).getByLabelText('Hinge max load'), { target: { value: '100' } });
    fireEvent.change(within(stage(1)).getByLabelText('Hinge impact allowed'), { target: { value: 'no' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save plan' }));

    await waitFor(() => expect(onSaved).toHaveBeenCalled());
    const [url] = fetchMock.mock.calls[0];
    expect(url).toBe(`/api/orgs/${ORG}/cases/${CASE}/plan`);
    const [body] = sentBodies('POST');
    // 1 lb = 0.45359237 kg exactly (NIST SP 811), so 100 lb = 45.359237 kg.
    expect(body.stages[0].patterns.hinge).toEqual({ mode: 'capped', caps: { maxLoadKg: fromUnit(100, 'lb'), impactAllowed: false } });
    expect(body.stages[0].patterns.hinge.caps.maxLoadKg).toBeCloseTo(45.359237, 9);
    // Free patterns are left out; the pain ceiling starts at the default.
    expect(Object.keys(body.stages[0].patterns)).toEqual(['hinge']);
    expect(body.stages[0].painCeiling).toBe(5);
  });

  it('says so when someone saved the plan first, and loads the latest on request', async () => {
    fetchMock.mockImplementation(async (_input, init) => {
      if (init?.method === 'PUT') {
        return jsonResponse(409, {
          error: { code: 'version_conflict', message: 'This plan was changed by someone else.' },
          requestId: 'r1',
        });
      }
      return jsonResponse(200, planDto(4, 'Newer words from a colleague.'));
    });
    renderWithProviders(<PlanEditor orgId={ORG} caseId={CASE} unit="kg" plan={planDto(3)} onSaved={vi.fn()} onCancel={vi.fn()} />);

    fireEvent.change(screen.getByLabelText('Guidance for the athlete and family'), { target: { value: 'No running yet.' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save plan' }));

    expect(await screen.findByText(/Someone saved this plan after you opened it/)).toBeInTheDocument();
    expect(sentBodies('PUT')[0].version).toBe(3);
    // Nothing is overwritten: saving again is blocked until the latest version is loaded.
    expect(screen.getByRole('button', { name: 'Save plan' })).toBeDisabled();

    fireEvent.click(screen.getByRole('button', { name: 'Load the latest version' }));
    await waitFor(() => expect(screen.getByLabelText('Guidance for the athlete and family')).toHaveValue('Newer words from a colleague.'));
    expect(screen.getByText(/Editing version 4/)).toBeInTheDocument();
    expect(screen.queryByText(/Someone saved this plan after you opened it/)).not.toBeInTheDocument();
  });

  it('keeps a stored load exactly when it is not touched', async () => {
    const plan = planDto(2);
    plan.current.stages[0].patterns.squat = { mode: 'capped', caps: { maxLoadKg: 27.2155 } };
    fetchMock.mockImplementation(async () => jsonResponse(200, planDto(3)));
    const onSaved = vi.fn();
    renderWithProviders(<PlanEditor orgId={ORG} caseId={CASE} unit="lb" plan={plan} onSaved={onSaved} onCancel={vi.fn()} />);
    expect(within(stage(1)).getByLabelText('Squat max load')).toHaveValue('60');
    fireEvent.click(screen.getByRole('button', { name: 'Save plan' }));
    await waitFor(() => expect(onSaved).toHaveBeenCalled());
    expect(sentBodies('PUT')[0].stages[0].patterns.squat.caps.maxLoadKg).toBe(27.2155);
  });

  it('shows only the limited patterns with their controls, and lists the others as "no limit"', () => {
    renderWithProviders(<PlanEditor orgId={ORG} caseId={CASE} unit="kg" plan={planDto(2)} onSaved={vi.fn()} onCancel={vi.fn()} />);
    const s1 = stage(1);
    expect(within(s1).getByRole('group', { name: 'Hinge mode' })).toBeInTheDocument();
    expect(within(s1).getByRole('group', { name: 'Jump / landing mode' })).toBeInTheDocument();
    expect(within(s1).getAllByRole('group', { name: / mode$/ })).toHaveLength(2);
    expect(within(s1).queryByRole('group', { name: 'Squat mode' })).not.toBeInTheDocument();
    expect(within(s1).getByText(/^No limit:/).parentElement).toHaveTextContent(
      'No limit: Squat, Lunge / single-leg, Horizontal push, Vertical push, Horizontal pull, Vertical pull, Carry, Rotation / anti-rotation, Sprint, Throw, Swing.',
    );
    const add = within(s1).getByLabelText('Add a limit for another movement');
    expect(within(add).queryByRole('option', { name: 'Hinge' })).not.toBeInTheDocument();
    expect(within(s1).getByRole('button', { name: 'Add limit' })).toBeDisabled();
  });

  it('saves the same plan as before when nothing is touched, and a limit added for another movement is saved with it', async () => {
    fetchMock.mockImplementation(async () => jsonResponse(200, planDto(3)));
    const onSaved = vi.fn();
    renderWithProviders(<PlanEditor orgId={ORG} caseId={CASE} unit="kg" plan={planDto(2)} onSaved={onSaved} onCancel={vi.fn()} />);
    fireEvent.click(screen.getByRole('button', { name: 'Save plan' }));
    await waitFor(() => expect(onSaved).toHaveBeenCalledTimes(1));
    expect(sentBodies('PUT')[0].stages[0].patterns).toEqual(planDto(2).current.stages[0].patterns);

    const s1 = stage(1);
    fireEvent.change(within(s1).getByLabelText('Add a limit for another movement'), { target: { value: 'sprint' } });
    fireEvent.click(within(s1).getByRole('button', { name: 'Add limit' }));
    const sprintMode = within(s1).getByRole('group', { name: 'Sprint mode' });
    fireEvent.click(within(sprintMode).getByRole('radio', { name: 'Blocked' }));
    expect(within(s1).getByText(/^No limit:/).parentElement).not.toHaveTextContent('Sprint');
    fireEvent.click(screen.getByRole('button', { name: 'Save plan' }));
    await waitFor(() => expect(onSaved).toHaveBeenCalledTimes(2));
    expect(sentBodies('PUT')[1].stages[0].patterns).toEqual({ ...planDto(2).current.stages[0].patterns, sprint: { mode: 'blocked' } });
  });

  it('keeps a row in view when its limit is taken off, and sends that pattern as free', async () => {
    fetchMock.mockImplementation(async () => jsonResponse(200, planDto(3)));
    const onSaved = vi.fn();
    renderWithProviders(<PlanEditor orgId={ORG} caseId={CASE} unit="kg" plan={planDto(2)} onSaved={onSaved} onCancel={vi.fn()} />);
    const jumpMode = within(stage(1)).getByRole('group', { name: 'Jump / landing mode' });
    fireEvent.click(within(jumpMode).getByRole('radio', { name: 'Free' }));
    expect(within(stage(1)).getByRole('group', { name: 'Jump / landing mode' })).toBeInTheDocument();
    fireEvent.click(screen.getByRole('button', { name: 'Save plan' }));
    await waitFor(() => expect(onSaved).toHaveBeenCalled());
    expect(sentBodies('PUT')[0].stages[0].patterns).toEqual({ hinge: { mode: 'capped', caps: { maxPercent1RM: 60 } } });
  });
});
