import { describe, expect, it } from 'vitest';
import type { AthleteWeekDto } from '../../../../../policies/dto';
import { setLines } from './week-set-lines';

type WeekSession = AthleteWeekDto['days'][number]['sessions'][number];

const set = (id: string, reps: number, kg: number) => ({
  id,
  reps,
  load: { kind: 'kg' as const, value: kg },
  targetRpe: null,
  warmUp: false,
});
const session = (sets: ReturnType<typeof set>[]) =>
  ({
    loadsKg: Object.fromEntries(sets.map((s) => [s.id, s.load.value])),
    content: { exercises: [{ exerciseId: 'e1', sets }] },
  }) as unknown as WeekSession;

describe('the coming week: planned sets as the athlete loads them', () => {
  it('a kg load read in pounds is rounded DOWN to a 5 lb step, never shown as 26.46 lb (1 lb = 0.45359237 kg, NIST SP 811)', () => {
    // 12 kg = 26.455 lb → 25 lb; 42 kg = 92.594 lb → 90 lb; 61.23496995 kg is exactly 135 lb and stays 135.
    const s = session([set('a', 5, 12), set('b', 5, 42), set('c', 5, 61.23496995)]);
    expect(setLines(s, s.content.exercises[0], 'lb')).toEqual([
      '1 set of 5 reps at 25 lb',
      '1 set of 5 reps at 90 lb',
      '1 set of 5 reps at 135 lb',
    ]);
  });

  it('kg loads are shown as planned (already on the exercise steps), and one rep is "1 rep"', () => {
    const s = session([set('a', 1, 42), set('b', 1, 42), set('c', 1, 42)]);
    expect(setLines(s, s.content.exercises[0], 'kg')).toEqual(['3 sets of 1 rep at 42 kg']);
  });
});
