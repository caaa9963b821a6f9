import { describe, expect, it } from 'vitest';
import { loadTimesReps, setsOf } from './loads';

describe('loads as the trade writes them (load × reps)', () => {
  it('writes load then reps, in the reader’s unit (1 lb = 0.45359237 kg, NIST SP 811)', () => {
    expect(loadTimesReps(80, 'kg', 5)).toBe('80 kg × 5');
    expect(loadTimesReps(45.359237, 'lb', 3)).toBe('100 lb × 3');
    expect(loadTimesReps(0, 'kg', 10)).toBe('body weight × 10');
  });

  it('folds identical sets into one line', () => {
    expect(setsOf(3, 80, 'kg', 5)).toBe('3 sets of 80 kg × 5');
    expect(setsOf(1, 80, 'kg', 5)).toBe('80 kg × 5');
  });
});
