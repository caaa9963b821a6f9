import { describe, expect, it, vi } from 'vitest';
import { fireEvent, screen } from '@testing-library/react';
import type { ExerciseDto } from '../../../../../policies/dto';
import { renderWithProviders } from '../../../test/render';
import { BaselineForm } from './BaselineForm';

const deadlift: ExerciseDto = {
  id: '33333333-3333-4333-8333-333333333333',
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

function renderForm() {
  const { container } = renderWithProviders(
    <BaselineForm orgId="org" athleteId="ath" unit="kg" library={[deadlift]} onSaved={vi.fn()} onCancel={vi.fn()} />,
  );
  const type = (label: string, value: string) => fireEvent.change(screen.getByLabelText(label), { target: { value } });
  // The live preview under the inputs.
  const preview = () => container.querySelector('p[aria-live="polite"]')!;
  return { type, preview };
}

describe('the baseline preview never shows NaN', () => {
  it('100 kg × 5 at RPE 8 (2 in reserve) → 7 reps → Epley 123.33 kg (Epley 1985, from memory; reps in reserve added: common practice; Zourdos et al. 2016, JSCR 30:267–275)', () => {
    const { type, preview } = renderForm();
    type('Load (kg)', '100');
    type('RPE (optional)', '8');
    expect(preview()).toHaveTextContent('Estimated 1RM: 123.33 kg (Epley, 7 reps — 5 done + 2 in reserve)');
  });

  it.each([
    ['0', 'RPE 0 is off the reps-in-reserve scale (1–10, Zourdos et al. 2016)'],
    ['abc', 'not a number'],
    ['11', 'past the top of the scale'],
  ])('RPE "%s" (%s) says in a sentence that the RPE must be from 1 to 10', (rpe) => {
    const { type, preview } = renderForm();
    type('Load (kg)', '100');
    type('RPE (optional)', rpe);
    expect(preview()).toHaveTextContent('The RPE must be a number from 1 to 10 (or left empty) to estimate the 1RM.');
    expect(preview()).not.toHaveTextContent(/NaN|Infinity/);
  });

  it('reps or a load that are not numbers are said in words too', () => {
    const { type, preview } = renderForm();
    expect(preview()).toHaveTextContent('Type a load and reps to see the 1RM.');
    type('Load (kg)', 'abc');
    expect(preview()).toHaveTextContent('Type a load above 0 to see the 1RM.');
    type('Load (kg)', '100');
    type('Reps', 'x');
    expect(preview()).toHaveTextContent('Type the reps as a whole number of at least 1 to see the 1RM.');
    expect(preview()).not.toHaveTextContent(/NaN/);
  });
});
