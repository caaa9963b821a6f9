import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import type { PlanDto } from '../../../../../policies/dto';
import type { StageCriterion } from '../../../../../policies/load/stage-criteria';
import { setCsrfToken } from '../../../lib/api-client';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { PlanEditor } from './PlanEditor';

const ORG = '11111111-1111-4111-8111-111111111111';
const CASE = '22222222-2222-4222-8222-222222222222';
const PLAN = '33333333-3333-4333-8333-333333333333';
const STAGE = '44444444-4444-4444-8444-444444444444';
const C1 = '55555555-5555-4555-8555-555555555551';
const C2 = '55555555-5555-4555-8555-555555555552';
const C3 = '55555555-5555-4555-8555-555555555553';
const C4 = '55555555-5555-4555-8555-555555555554';

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => {
  vi.stubGlobal('fetch', fetchMock);
  setCsrfToken('token-1');
});
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

const STORED: StageCriterion[] = [
  { id: C1, kind: 'record', rule: 'pain_settled_sessions', count: 3, maxPain: 2 },
  { id: C2, kind: 'record', rule: 'no_red_flags' },
  { id: C3, kind: 'clinician', label: 'Side plank hold, each side', measure: 'threshold', threshold: 45, direction: 'at_least', unit: 's' },
  { id: C4, kind: 'athlete', threshold: 7 },
];

function planDto(version: number, criteria?: StageCriterion[]): PlanDto {
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
      guidance: 'Walk freely.',
      changeNote: null,
      createdAt: '2026-03-02T09:00:00.000Z',
      createdByName: 'Priya Raman',
      stages: [
        {
          id: STAGE,
          label: 'Settle',
          startDate: '2026-03-02',
          endDate: '2026-03-15',
          painCeiling: 3,
          patterns: { jump: { mode: 'blocked' } },
          ...(criteria ? { criteria } : {}),
        },
      ],
    },
  };
}

const puts = () => fetchMock.mock.calls.filter(([, init]) => init?.method === 'PUT').map(([, init]) => JSON.parse(String(init?.body)));
const stage = (n: number) => screen.getByRole('group', { name: `Stage ${n}` });
const criterion = (n: number, kind: string) => within(stage(1)).getByRole('group', { name: `Criterion ${n}: ${kind}` });

function open(plan = planDto(2, STORED)) {
  fetchMock.mockImplementation(async () => jsonResponse(200, planDto(3)));
  const onSaved = vi.fn();
  renderWithProviders(<PlanEditor orgId={ORG} caseId={CASE} unit="kg" plan={plan} onSaved={onSaved} onCancel={vi.fn()} />);
  return onSaved;
}

describe('exit criteria in the plan editor', () => {
  it('shows each stored criterion in its own fields and saves them back exactly when untouched', async () => {
    const onSaved = open();
    expect(within(criterion(1, 'From the record')).getByLabelText('Sessions needed')).toHaveValue('3');
    expect(within(criterion(1, 'From the record')).getByLabelText('Highest pain during')).toHaveValue('2');
    expect(within(criterion(2, 'From the record')).queryByLabelText('Sessions needed')).not.toBeInTheDocument();
    const test = criterion(3, 'Assessed by the clinician');
    expect(within(test).getByLabelText('What is assessed')).toHaveValue('Side plank hold, each side');
    expect(within(test).getByLabelText('Threshold')).toHaveValue('45');
    expect(within(test).getByLabelText('Unit (optional)')).toHaveValue('s');
    expect(within(criterion(4, 'Reported by the athlete')).getByLabelText('Readiness needed')).toHaveValue('7');
    // The plain words the athlete and family will read, from the shared wording (policies/plain-words.ts).
    expect(within(criterion(4, 'Reported by the athlete')).getByText(/Feeling ready to move on: at least 7 out of 10/)).toBeInTheDocument();

    fireEvent.click(screen.getByRole('button', { name: 'Save plan' }));
    await waitFor(() => expect(onSaved).toHaveBeenCalled());
    expect(puts()[0].stages[0].criteria).toEqual(STORED);
  });

  it('adds one criterion of each kind and saves it with the plan version', async () => {
    const onSaved = open(planDto(2));
    fireEvent.click(within(stage(1)).getByRole('button', { name: '+ From the record' }));
    const rec = criterion(1, 'From the record');
    fireEvent.change(within(rec).getByLabelText('Rule'), { target: { value: 'rpe_at_most' } });
    fireEvent.change(within(rec).getByLabelText('Highest session effort'), { target: { value: '5' } });

    fireEvent.click(within(stage(1)).getByRole('button', { name: '+ Assessed by the clinician' }));
    const judge = criterion(2, 'Assessed by the clinician');
    fireEvent.change(within(judge).getByLabelText('What is assessed'), { target: { value: 'Hops on the sore leg without pain' } });
    fireEvent.change(within(judge).getByLabelText('Recorded as'), { target: { value: 'yes_no' } });
    expect(within(judge).queryByLabelText('Threshold')).not.toBeInTheDocument();

    fireEvent.click(within(stage(1)).getByRole('button', { name: '+ Reported by the athlete' }));
    fireEvent.change(within(criterion(3, 'Reported by the athlete')).getByLabelText('Readiness needed'), { target: { value: '8' } });

    fireEvent.click(screen.getByRole('button', { name: 'Save plan' }));
    await waitFor(() => expect(onSaved).toHaveBeenCalled());
    const [body] = puts();
    expect(body.version).toBe(2);
    expect(body.stages[0].criteria.map(({ id: _id, ...rest }: StageCriterion) => rest)).toEqual([
      // A new record criterion starts at 3 sessions; the effort cap is what was typed.
      { kind: 'record', rule: 'rpe_at_most', count: 3, maxRpe: 5 },
      { kind: 'clinician', label: 'Hops on the sore leg without pain', measure: 'yes_no' },
      { kind: 'athlete', threshold: 8 },
    ]);
    expect(new Set(body.stages[0].criteria.map((c: StageCriterion) => c.id)).size).toBe(3);
  });

  it('names each field problem beside the field and in the summary, and sends nothing', async () => {
    open(planDto(2));
    fireEvent.click(within(stage(1)).getByRole('button', { name: '+ Assessed by the clinician' }));
    fireEvent.click(within(stage(1)).getByRole('button', { name: '+ Reported by the athlete' }));
    fireEvent.change(within(criterion(2, 'Reported by the athlete')).getByLabelText('Readiness needed'), { target: { value: '11' } });
    fireEvent.click(within(stage(1)).getByRole('button', { name: '+ From the record' }));
    fireEvent.change(within(criterion(3, 'From the record')).getByLabelText('Sessions needed'), { target: { value: 'three' } });

    fireEvent.click(screen.getByRole('button', { name: 'Save plan' }));
    const summary = await screen.findByRole('alert');
    expect(summary).toHaveTextContent('Stage 1, criterion 1: What is assessed');
    expect(summary).toHaveTextContent('Stage 1, criterion 1: Threshold is needed for a measured test');
    expect(summary).toHaveTextContent('Stage 1, criterion 2: Readiness needed must be 0–10');
    expect(summary).toHaveTextContent('Stage 1, criterion 3: Sessions needed is required (a number)');
    expect(within(criterion(1, 'Assessed by the clinician')).getByLabelText('Threshold')).toHaveAttribute('aria-invalid', 'true');
    expect(within(criterion(1, 'Assessed by the clinician')).getByText('Threshold is needed for a measured test')).toBeInTheDocument();
    expect(within(criterion(2, 'Reported by the athlete')).getByText('Readiness needed must be 0–10')).toBeInTheDocument();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('removes a criterion, and a stage left with none is saved without criteria', async () => {
    const onSaved = open(planDto(2, [STORED[3]]));
    fireEvent.click(within(stage(1)).getByRole('button', { name: 'Remove criterion 1 of stage 1' }));
    expect(within(stage(1)).queryByRole('group', { name: /^Criterion 1/ })).not.toBeInTheDocument();
    fireEvent.click(screen.getByRole('button', { name: 'Save plan' }));
    await waitFor(() => expect(onSaved).toHaveBeenCalled());
    expect(puts()[0].stages[0]).not.toHaveProperty('criteria');
  });
});
