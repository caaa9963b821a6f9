import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { setCsrfToken } from '../../../lib/api-client';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { PlanEditor } from './PlanEditor';

const ORG = '11111111-1111-4111-8111-111111111111';
const CASE = '22222222-2222-4222-8222-222222222222';

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => {
  vi.stubGlobal('fetch', fetchMock);
  setCsrfToken('token-1');
});
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

describe('the stage pain ceiling above the model’s 5 (Silbernagel et al. 2007, AJSM 35:897–906)', () => {
  it('warns, names the model ceiling of 5, and still saves the clinician’s 7 (a warning, not a refusal)', async () => {
    fetchMock.mockImplementation(async () => jsonResponse(500, {}));
    renderWithProviders(<PlanEditor orgId={ORG} caseId={CASE} unit="kg" onSaved={() => {}} onCancel={() => {}} />);
    const stage = screen.getByRole('group', { name: 'Stage 1' });
    const ceiling = within(stage).getByLabelText('Pain ceiling');
    expect(within(stage).getByRole('status')).toHaveTextContent('');

    fireEvent.change(ceiling, { target: { value: '7' } });
    const warning =
      "A ceiling of 7/10 is above the pain-monitoring model's ceiling of 5/10 (Silbernagel et al. 2007). Loadline will use 7, as you set it.";
    expect(within(stage).getByRole('status')).toHaveTextContent(warning);
    expect(ceiling).toHaveAccessibleDescription(expect.stringContaining("model's ceiling of 5/10"));
    expect(ceiling).not.toHaveAttribute('aria-invalid');

    fireEvent.change(ceiling, { target: { value: '5' } });
    expect(within(stage).getByRole('status')).toHaveTextContent('');
    fireEvent.change(ceiling, { target: { value: '7' } });
    fireEvent.change(within(stage).getByLabelText('Start date'), { target: { value: '2026-03-02' } });
    fireEvent.change(within(stage).getByLabelText('End date'), { target: { value: '2026-03-15' } });
    fireEvent.click(screen.getByRole('button', { name: /save/i }));
    await waitFor(() => expect(fetchMock.mock.calls.some(([, init]) => init?.method === 'POST')).toBe(true));
    const post = fetchMock.mock.calls.find(([, init]) => init?.method === 'POST')!;
    expect(JSON.parse(String(post[1]?.body)).stages[0].painCeiling).toBe(7);
  });
});
