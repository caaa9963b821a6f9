import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import type { PlanTemplateDto } from '../../../../../policies/dto';
import { setCsrfToken } from '../../../lib/api-client';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { PlanEditor } from '../../plans/components/PlanEditor';

const ORG = '11111111-1111-4111-8111-111111111111';
const CASE = '22222222-2222-4222-8222-222222222222';
const TEMPLATE = '55555555-5555-4555-8555-555555555555';

const template: PlanTemplateDto = {
  id: TEMPLATE,
  name: 'Low back, extension-related',
  description: '',
  authorId: 'm-priya',
  authorName: 'Priya Raman',
  stageCount: 2,
  lengthDays: 28,
  canEdit: true,
  updatedAt: '2026-03-01T09:00:00.000Z',
  version: 1,
  guidance: 'Walk and cycle freely.',
  stages: [
    { label: 'Settle', startOffset: 0, endOffset: 13, painCeiling: 3, patterns: { jump: { mode: 'blocked' } } },
    { label: 'Build', startOffset: 14, endOffset: 27, painCeiling: 4, patterns: {} },
  ],
};

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => {
  vi.stubGlobal('fetch', fetchMock);
  setCsrfToken('token-1');
});
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

const stage = (n: number) => screen.getByRole('group', { name: `Stage ${n}` });

describe('Start from a template (plan editor)', () => {
  it('dates the stages from the chosen first day and leaves them editable; nothing is saved until Save plan', async () => {
    fetchMock.mockImplementation(async (url) => {
      const { stages: _s, guidance: _g, ...summary } = template;
      return String(url).endsWith('/plan-templates') ? jsonResponse(200, [summary]) : jsonResponse(200, template);
    });
    renderWithProviders(<PlanEditor orgId={ORG} caseId={CASE} unit="kg" onSaved={vi.fn()} onCancel={vi.fn()} />);
    expect(fetchMock).not.toHaveBeenCalled();
    fireEvent.click(screen.getByRole('button', { name: 'Start from a template' }));
    const pick = await screen.findByLabelText('Template');
    fireEvent.change(pick, { target: { value: TEMPLATE } });
    fireEvent.change(screen.getByLabelText('First day of the plan'), { target: { value: '2026-12-24' } });
    fireEvent.click(screen.getByRole('button', { name: 'Use this template' }));

    // Day 0–13 from 24 Dec 2026 is 24 Dec–6 Jan; day 14–27 is 7–20 Jan 2027 (calendar arithmetic by hand).
    await waitFor(() => expect(within(stage(2)).getByLabelText('Start date')).toHaveValue('2027-01-07'));
    expect(within(stage(1)).getByLabelText('Start date')).toHaveValue('2026-12-24');
    expect(within(stage(1)).getByLabelText('End date')).toHaveValue('2027-01-06');
    expect(within(stage(2)).getByLabelText('End date')).toHaveValue('2027-01-20');
    expect(screen.getByLabelText('Guidance for the athlete and family')).toHaveValue('Walk and cycle freely.');
    expect(screen.getByText(/Started from “Low back, extension-related”/)).toBeInTheDocument();
    // Still a draft: only reads went out.
    expect(fetchMock.mock.calls.every(([, init]) => (init?.method ?? 'GET') === 'GET')).toBe(true);
  });

  it('names the template and the version it was started from when the plan is saved', async () => {
    fetchMock.mockImplementation(async (url, init) => {
      const { stages: _s, guidance: _g, ...summary } = template;
      if (init?.method === 'POST') return jsonResponse(201, {});
      return String(url).endsWith('/plan-templates') ? jsonResponse(200, [summary]) : jsonResponse(200, template);
    });
    const onSaved = vi.fn();
    renderWithProviders(<PlanEditor orgId={ORG} caseId={CASE} unit="kg" onSaved={onSaved} onCancel={vi.fn()} />);
    fireEvent.click(screen.getByRole('button', { name: 'Start from a template' }));
    fireEvent.change(await screen.findByLabelText('Template'), { target: { value: TEMPLATE } });
    fireEvent.change(screen.getByLabelText('First day of the plan'), { target: { value: '2026-12-24' } });
    fireEvent.click(screen.getByRole('button', { name: 'Use this template' }));
    await waitFor(() => expect(within(stage(2)).getByLabelText('Start date')).toHaveValue('2027-01-07'));
    // Edited before saving: stage 1 ends a day later.
    fireEvent.change(within(stage(2)).getByLabelText('Start date'), { target: { value: '2027-01-08' } });
    fireEvent.change(within(stage(1)).getByLabelText('End date'), { target: { value: '2027-01-07' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save plan' }));
    await waitFor(() => expect(onSaved).toHaveBeenCalled());
    const post = fetchMock.mock.calls.find(([, init]) => init?.method === 'POST')!;
    const body = JSON.parse(String(post[1]?.body));
    expect(body.fromTemplate).toEqual({ id: TEMPLATE, version: template.version });
    expect(body.stages.map((x: { startDate: string; endDate: string }) => [x.startDate, x.endDate])).toEqual([
      ['2026-12-24', '2027-01-07'],
      ['2027-01-08', '2027-01-20'],
    ]);
  });
});

describe('Start from a template: what the dialog says before anything is dated', () => {
  it('says the organization has none yet, and where one comes from', async () => {
    fetchMock.mockResolvedValue(jsonResponse(200, []));
    renderWithProviders(<PlanEditor orgId={ORG} caseId={CASE} unit="kg" onSaved={vi.fn()} onCancel={vi.fn()} />);
    fireEvent.click(screen.getByRole('button', { name: 'Start from a template' }));
    expect(
      await screen.findByText('Your organization has no plan templates yet. Save a plan as a template from its case.'),
    ).toBeInTheDocument();
    // The blank first stage is still there to write from.
    expect(stage(1)).toBeInTheDocument();
  });

  it('waits for a template and a whole first day before it dates anything', async () => {
    const { stages: _s, guidance: _g, ...summary } = template;
    fetchMock.mockResolvedValue(jsonResponse(200, [summary]));
    renderWithProviders(<PlanEditor orgId={ORG} caseId={CASE} unit="kg" onSaved={vi.fn()} onCancel={vi.fn()} />);
    fireEvent.click(screen.getByRole('button', { name: 'Start from a template' }));
    const use = () => screen.getByRole('button', { name: 'Use this template' });
    expect(await screen.findByRole('option', { name: 'Low back, extension-related (2 stages, 28 days)' })).toBeInTheDocument();
    expect(use()).toBeDisabled();
    fireEvent.change(screen.getByLabelText('Template'), { target: { value: TEMPLATE } });
    expect(use()).toBeEnabled();
    fireEvent.change(screen.getByLabelText('First day of the plan'), { target: { value: '' } });
    expect(use()).toBeDisabled();
  });

  it('says so when the chosen template cannot be loaded, and leaves the stages as they were', async () => {
    const { stages: _s, guidance: _g, ...summary } = template;
    fetchMock.mockImplementation(async (url) =>
      String(url).endsWith('/plan-templates')
        ? jsonResponse(200, [summary])
        : jsonResponse(404, { error: { code: 'not_found', message: 'No such template.' }, requestId: 'r' }),
    );
    renderWithProviders(<PlanEditor orgId={ORG} caseId={CASE} unit="kg" onSaved={vi.fn()} onCancel={vi.fn()} />);
    fireEvent.click(screen.getByRole('button', { name: 'Start from a template' }));
    fireEvent.change(await screen.findByLabelText('Template'), { target: { value: TEMPLATE } });
    fireEvent.click(screen.getByRole('button', { name: 'Use this template' }));
    expect(await screen.findByText(/^That template could not be loaded\./)).toHaveAttribute('role', 'status');
    expect(screen.queryByRole('group', { name: 'Stage 2' })).not.toBeInTheDocument();
  });
});
