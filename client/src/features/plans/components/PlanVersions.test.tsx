import { describe, expect, it } from 'vitest';
import { fireEvent, render, screen, within } from '@testing-library/react';
import type { PlanVersionDto } from '../../../../../policies/dto';
import { VersionsList } from './PlanVersions';

const STAGE = '44444444-4444-4444-8444-444444444444';

function version(n: number, percent: number, by: string): PlanVersionDto {
  return {
    planId: 'p1',
    version: n,
    guidance: 'Walk freely.',
    changeNote: n === 1 ? null : 'Hinge up after a calm week',
    createdAt: `2026-03-0${n}T09:00:00.000Z`,
    createdByName: by,
    stages: [
      {
        id: STAGE,
        label: 'Protect',
        startDate: '2026-03-02',
        endDate: '2026-03-15',
        painCeiling: 4,
        patterns: { hinge: { mode: 'capped', caps: { maxPercent1RM: percent } } },
      },
    ],
  };
}

describe('VersionsList', () => {
  it('lists who saved each version and shows a changed cap between two of them', () => {
    render(<VersionsList versions={[version(3, 70, 'Marcus Bell'), version(2, 60, 'Priya Raman'), version(1, 60, 'Priya Raman')]} />);
    expect(screen.getByText('Marcus Bell')).toBeInTheDocument();

    // Newest against the one before it, by default.
    const diff = screen.getByRole('table', { name: 'Changes from version 2 to version 3' });
    const row = within(diff).getByRole('row', { name: /Hinge: max % of estimated 1RM/ });
    expect(row).toHaveTextContent('Stage 1 (Protect)');
    expect(row).toHaveTextContent(/60\s*→?\s*changed to\s*70/);

    // Two versions with the same content say so.
    fireEvent.change(screen.getByLabelText('Compare version'), { target: { value: '1' } });
    fireEvent.change(screen.getByLabelText('with version'), { target: { value: '2' } });
    expect(screen.getByText('These two versions say the same thing.')).toBeInTheDocument();
  });
});
