import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import type { StageCriteriaDto } from '../../../../../policies/dto';
import { jargonIn } from '../../../../../policies/plain-words';
import { setCsrfToken } from '../../../lib/api-client';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { NextStageUnlocks } from './NextStageUnlocks';
import { StageCriteriaPanel } from './StageCriteriaPanel';

// Criteria-based progression (Bern consensus, Ardern et al. 2016: a shared decision).
const ORG = '11111111-1111-4111-8111-111111111111';
const PLAN = '22222222-2222-4222-8222-222222222222';
const uuid = (n: number) => `00000000-0000-4000-8000-${String(n).padStart(12, '0')}`;

function dto(more: Partial<StageCriteriaDto> = {}): StageCriteriaDto {
  return {
    planId: PLAN,
    planVersion: 2,
    today: '2026-06-10',
    stage: { id: uuid(1), label: 'Settle', startDate: '2026-06-01', endDate: '2026-06-14', number: 1, of: 2 },
    nextStage: { id: uuid(2), label: 'Build back', startDate: '2026-06-15', number: 2 },
    criteria: [
      {
        criterion: { id: uuid(3), kind: 'record', rule: 'pain_settled_sessions', count: 3, maxPain: 3 },
        result: {
          criterionId: uuid(3),
          kind: 'record',
          state: 'not_met',
          have: 2,
          need: 3,
          evidence: '2 sessions in a row …',
          lastDate: '2026-06-09',
        },
        plain:
          '3 training days in a row with pain during training at 3 out of 10 or less, and no worse the next morning than before training.',
        plainProgress: '2 of 3 so far.',
      },
      {
        criterion: { id: uuid(4), kind: 'clinician', label: 'Bends forward without pain', measure: 'yes_no' },
        result: {
          criterionId: uuid(4),
          kind: 'clinician',
          state: 'met',
          have: 1,
          need: 1,
          evidence: 'assessed 2026-06-10: yes',
          lastDate: '2026-06-10',
        },
        plain: 'A check with the clinician: Bends forward without pain.',
        plainProgress: 'Done.',
      },
      {
        criterion: { id: uuid(5), kind: 'athlete', threshold: 7 },
        result: { criterionId: uuid(5), kind: 'athlete', state: 'waiting', have: 0, need: 1, evidence: '', lastDate: null },
        plain: 'Feeling ready to move on: at least 7 out of 10 when asked.',
        plainProgress: 'Not answered yet in this stage.',
      },
    ],
    allMet: false,
    metCount: 1,
    promptToMove: false,
    canAssess: true,
    canRate: false,
    decisions: [],
    ...more,
  };
}

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => {
  vi.stubGlobal('fetch', fetchMock);
  setCsrfToken('token-1');
});
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

describe('StageCriteriaPanel (care team)', () => {
  it('shows each state as a word and glyph with its evidence, and records who agreed to move on early', async () => {
    fetchMock.mockResolvedValueOnce(jsonResponse(200, dto()));
    renderWithProviders(<StageCriteriaPanel orgId={ORG} planId={PLAN} />);
    expect(await screen.findByText(/1 of 3 met/)).toBeInTheDocument();
    expect(screen.getByText('… Not yet')).toBeInTheDocument();
    expect(screen.getByText('✓ Met')).toBeInTheDocument();
    expect(screen.getByText('assessed 2026-06-10: yes')).toBeInTheDocument();
    expect(screen.queryByText(/Every criterion is met/)).not.toBeInTheDocument();

    fireEvent.click(screen.getByRole('button', { name: /Move to stage 2/ }));
    fireEvent.click(screen.getByLabelText('The athlete'));
    // The advance answers, then the plan's criteria are read again (the plan changed).
    fetchMock.mockResolvedValue(jsonResponse(200, dto({ planVersion: 3 })));
    fireEvent.click(screen.getByRole('button', { name: 'Record the decision and move on' }));
    await waitFor(() => expect(fetchMock.mock.calls.some(([u]) => String(u).endsWith('/advance'))).toBe(true));
    const [, init] = fetchMock.mock.calls.find(([u]) => String(u).endsWith('/advance'))!;
    expect(JSON.parse(String(init?.body))).toEqual({
      fromStageId: uuid(1),
      effectiveDate: '2026-06-10',
      agreedBy: ['athlete'],
      version: 2,
    });
  });

  it('when every criterion is met, asks the clinician (never moves by itself)', async () => {
    fetchMock.mockResolvedValueOnce(jsonResponse(200, dto({ allMet: true, metCount: 3, promptToMove: true })));
    renderWithProviders(<StageCriteriaPanel orgId={ORG} planId={PLAN} />);
    expect(await screen.findByText(/Every criterion is met. Move on to stage 2 \(Build back\)\?/)).toBeInTheDocument();
  });
});

describe('NextStageUnlocks (athlete and family)', () => {
  it('reads in plain words how far along each criterion is, with no trade jargon (common practice)', async () => {
    fetchMock.mockResolvedValueOnce(jsonResponse(200, dto({ canAssess: false })));
    renderWithProviders(<NextStageUnlocks orgId={ORG} planId={PLAN} name="Maya" />);
    const section = await screen.findByRole('region', { name: 'What unlocks the next stage' });
    expect(section).toHaveTextContent('1 of 3 done');
    expect(section).toHaveTextContent('2 of 3 so far.');
    expect(jargonIn(section.textContent ?? '')).toEqual([]);
    expect(screen.queryByText(/How ready do you feel/)).not.toBeInTheDocument();
  });

  it('asks the athlete how ready they feel and sends it', async () => {
    fetchMock.mockResolvedValueOnce(jsonResponse(200, dto({ canAssess: false, canRate: true })));
    renderWithProviders(<NextStageUnlocks orgId={ORG} planId={PLAN} />);
    fireEvent.click(await screen.findByLabelText('How ready do you feel to move on? 6'));
    fetchMock.mockResolvedValueOnce(jsonResponse(201, dto({ canAssess: false, canRate: true })));
    fireEvent.click(screen.getByRole('button', { name: 'Send' }));
    await waitFor(() => expect(fetchMock).toHaveBeenCalledTimes(2));
    expect(JSON.parse(String(fetchMock.mock.calls[1][1]?.body))).toEqual({ stageId: uuid(1), value: 6 });
    expect(await screen.findByText(/your clinician will see it/)).toBeInTheDocument();
  });
});
