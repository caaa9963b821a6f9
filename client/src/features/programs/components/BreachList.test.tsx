import { describe, expect, it, vi } from 'vitest';
import { fireEvent, render, screen } from '@testing-library/react';
import type { Breach } from '../../../../../policies/load/compliance';
import { BreachList } from './BreachList';

const cut: Breach = {
  setId: 's1',
  sessionId: 'sess',
  date: '2027-01-05',
  exerciseId: 'kbs',
  rule: 'rpe',
  pattern: 'hinge',
  limit: 'max RPE 6',
  planned: 'RPE 10 (estimated from 60% × 60)',
  fits: 'cut to 48 reps: 8 kg × 48 fits',
  fittingKg: 8,
  fittingReps: 48,
  waived: false,
  message:
    'Hinge: max RPE 6: planned RPE 10 (estimated from 60% × 60); no load on the available implements fits 60 reps — cut to 48 reps: 8 kg × 48 fits.',
};

describe('BreachList fixes', () => {
  it('when no load fits the planned reps, the fix button names the reps and applies them with the load', () => {
    const onUseLoad = vi.fn();
    render(<BreachList items={[{ athleteId: 'a', athleteName: null, breach: cut }]} onUseLoad={onUseLoad} />);
    fireEvent.click(screen.getByRole('button', { name: 'Use 48 reps at 8 kg' }));
    expect(onUseLoad).toHaveBeenCalledWith(8, 'kg', 48);
  });

  it('a load-only fix keeps the reps', () => {
    const onUseLoad = vi.fn();
    const { fittingReps: _none, ...loadOnly } = { ...cut, fittingKg: 82.5 };
    render(<BreachList items={[{ athleteId: 'a', athleteName: null, breach: loadOnly }]} onUseLoad={onUseLoad} />);
    fireEvent.click(screen.getByRole('button', { name: 'Use 82.5 kg' }));
    expect(onUseLoad).toHaveBeenCalledWith(82.5, 'kg', undefined);
  });
});
