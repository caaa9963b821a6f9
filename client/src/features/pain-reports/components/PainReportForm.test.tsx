import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, within } from '@testing-library/react';
import { redFlagQuestionsFor } from '../../../../../policies/red-flags';
import { todayLocal } from '../../../lib/dates';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { PainReportForm } from './PainReportForm';
import { EMERGENCY_HEADING } from './ReportOutcome';

const ATHLETE = '22222222-2222-4222-8222-222222222222';
const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => vi.stubGlobal('fetch', fetchMock));
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

function answer(question: string, choice: 'Yes' | 'No') {
  fireEvent.click(within(screen.getByRole('radiogroup', { name: question })).getByRole('radio', { name: choice }));
}

const BACK = redFlagQuestionsFor(['lower_back']);
const KNEE = redFlagQuestionsFor(['knee_left']);

async function fillDetailsAndContinue(place = 'Lower back') {
  const picture = screen.getByRole('group', { name: 'Where does it hurt?' });
  fireEvent.click(within(picture).getByRole('button', { name: place }));
  expect(within(picture).getByRole('button', { name: place })).toHaveAttribute('aria-pressed', 'true');
  expect(screen.getByRole('checkbox', { name: place })).toBeChecked();
  fireEvent.click(screen.getByRole('radio', { name: 'Pain now 4' }));
  fireEvent.click(screen.getByRole('radio', { name: 'Worst pain in the last 24 hours 6' }));
  expect(screen.getByLabelText('When did it start?')).toHaveValue(todayLocal());
  answer('Did it start in training?', 'Yes');
  fireEvent.click(screen.getByRole('button', { name: 'Next: warning signs' }));
  expect(await screen.findByRole('heading', { name: 'Warning signs' })).toBeInTheDocument();
}

function renderForm() {
  return renderWithProviders(<PainReportForm orgId="org-1" athleteId={ATHLETE} emergencyNumber="911" homeHref="/athlete" />);
}

describe('PainReportForm', () => {
  it('cannot be sent until every warning question has a Yes or No — none is answered for the athlete', async () => {
    renderForm();
    await fillDetailsAndContinue();
    for (const item of BACK) {
      const group = screen.getByRole('radiogroup', { name: item.question });
      expect(within(group).getByRole('radio', { name: 'Yes' })).not.toBeChecked();
      expect(within(group).getByRole('radio', { name: 'No' })).not.toBeChecked();
    }
    // All but the last two answered.
    for (const item of BACK.slice(0, -2)) answer(item.question, 'No');
    fireEvent.click(screen.getByRole('button', { name: 'Send report' }));
    expect(await screen.findByRole('alert')).toHaveTextContent('Answer every question before sending: 2 still need a Yes or No.');
    expect(fetchMock).not.toHaveBeenCalled();
    const lastGroup = screen.getByRole('radiogroup', { name: BACK.at(-1)!.question });
    expect(lastGroup).toHaveAccessibleDescription('Answer Yes or No.');

    for (const item of BACK.slice(-2)) answer(item.question, 'No');
    fetchMock.mockResolvedValue(
      jsonResponse(201, {
        report: { id: 'r1' },
        route: 'routine',
        statusSetToOut: false,
        message: 'Thanks — your care team has been told.',
        emergencyNumber: '911',
      }),
    );
    fireEvent.click(screen.getByRole('button', { name: 'Send report' }));
    expect(await screen.findByRole('heading', { name: 'Your care team has your report' })).toBeInTheDocument();
    const body = JSON.parse(fetchMock.mock.calls[0][1]?.body as string);
    expect(body).toMatchObject({ athleteId: ATHLETE, bodyRegions: ['lower_back'], painNow: 4, painWorst24h: 6, startedInTraining: true });
    expect(Object.keys(body.redFlags).sort()).toEqual(BACK.map((i) => i.id).sort());
    expect(Object.values(body.redFlags).every((v) => v === false)).toBe(true);
  });

  it('shows the emergency instruction from the server first', async () => {
    renderForm();
    await fillDetailsAndContinue();
    for (const item of BACK) answer(item.question, item.id === 'bladder_change' ? 'Yes' : 'No');
    fetchMock.mockResolvedValue(
      jsonResponse(201, {
        report: { id: 'r1' },
        route: 'emergency',
        statusSetToOut: true,
        message: 'Stop training now.',
        emergencyNumber: '112',
      }),
    );
    fireEvent.click(screen.getByRole('button', { name: 'Send report' }));
    const heading = await screen.findByRole('heading', { name: EMERGENCY_HEADING });
    expect(screen.getAllByRole('heading')[0]).toBe(heading);
    expect(screen.getByRole('link', { name: /Call 112/ })).toHaveAttribute('href', 'tel:112');
  });

  it('still shows the emergency instruction when an emergency report cannot be sent', async () => {
    renderForm();
    await fillDetailsAndContinue();
    for (const item of BACK) answer(item.question, item.id === 'saddle_numbness' ? 'Yes' : 'No');
    fetchMock.mockRejectedValue(new TypeError('Failed to fetch'));
    fireEvent.click(screen.getByRole('button', { name: 'Send report' }));
    expect(await screen.findByRole('heading', { name: EMERGENCY_HEADING })).toBeInTheDocument();
    expect(screen.getByRole('link', { name: /Call 911/ })).toHaveAttribute('href', 'tel:911');
    expect(screen.getByRole('alert')).toHaveTextContent('Your report did not reach Loadline.');
    expect(screen.getByRole('button', { name: 'Try sending the report again' })).toBeInTheDocument();
  });

  it('a knee gets only the questions for any pain: no back questions, and only those answers are sent (NICE NG59; Finucane et al. 2020)', async () => {
    renderForm();
    await fillDetailsAndContinue('Left knee');
    expect(screen.queryByRole('heading', { name: 'About your back, hips and legs' })).not.toBeInTheDocument();
    for (const item of BACK.filter((i) => i.scope === 'back_or_pelvis')) {
      expect(screen.queryByRole('radiogroup', { name: item.question })).not.toBeInTheDocument();
    }
    expect(
      screen.getByRole('radiogroup', { name: 'Do you have a fever, or feel generally unwell, along with the pain?' }),
    ).toBeInTheDocument();
    for (const item of KNEE) answer(item.question, item.id === 'osteoporosis' ? 'Yes' : 'No');
    fetchMock.mockResolvedValue(
      jsonResponse(201, {
        report: { id: 'r1' },
        route: 'urgent',
        statusSetToOut: false,
        message: 'Please contact your clinician today.',
        emergencyNumber: '911',
      }),
    );
    fireEvent.click(screen.getByRole('button', { name: 'Send report' }));
    await screen.findByText(/contact your clinician today/);
    const body = JSON.parse(fetchMock.mock.calls[0][1]?.body as string);
    expect(Object.keys(body.redFlags).sort()).toEqual(KNEE.map((i) => i.id).sort());
  });

  it('the back questions appear for the lower back, and their answers are dropped if the back is taken off again (NICE NG59)', async () => {
    renderForm();
    await fillDetailsAndContinue();
    expect(screen.getByRole('heading', { name: 'About your back, hips and legs' })).toBeInTheDocument();
    expect(
      screen.getByRole('radiogroup', {
        name: 'Have you started to have pain, numbness, tingling or weakness in both legs that you did not have before?',
      }),
    ).toBeInTheDocument();
    for (const item of BACK) answer(item.question, 'No');
    fireEvent.click(screen.getByRole('button', { name: 'Back to where and how much' }));
    const picture = screen.getByRole('group', { name: 'Where does it hurt?' });
    fireEvent.click(within(picture).getByRole('button', { name: 'Lower back' }));
    fireEvent.click(within(picture).getByRole('button', { name: 'Left knee' }));
    fireEvent.click(screen.getByRole('button', { name: 'Next: warning signs' }));
    expect(await screen.findByRole('heading', { name: 'Warning signs' })).toBeInTheDocument();
    fetchMock.mockResolvedValue(
      jsonResponse(201, {
        report: { id: 'r1' },
        route: 'routine',
        statusSetToOut: false,
        message: 'Thanks — your care team has been told.',
        emergencyNumber: '911',
      }),
    );
    fireEvent.click(screen.getByRole('button', { name: 'Send report' }));
    await screen.findByRole('heading', { name: 'Your care team has your report' });
    const body = JSON.parse(fetchMock.mock.calls[0][1]?.body as string);
    expect(body.bodyRegions).toEqual(['knee_left']);
    expect(Object.keys(body.redFlags).sort()).toEqual(KNEE.map((i) => i.id).sort());
  });
});
