import { describe, expect, it } from 'vitest';
import type { Breach } from '../../../../../policies/load/compliance';
import { holdLines } from './HoldNotice';

const breach = (setId: string, exerciseId: string, message: string) => ({ setId, exerciseId, message }) as Breach;
const exercises = [
  { exerciseId: 'dl', sets: [{ id: 'a' }, { id: 'b' }, { id: 'c' }] },
  { exerciseId: 'sq', sets: [{ id: 'd' }, { id: 'e' }] },
];
const names: Record<string, string> = { dl: 'Deadlift', sq: 'Back squat' };

describe('why a session is on hold', () => {
  it('says a reason once per exercise, naming the sets it holds, instead of once per set without saying which', () => {
    const cap = 'Hinge: max 50% of 85 kg = 42.5 kg: planned 50 kg';
    expect(
      holdLines(
        [breach('c', 'dl', cap), breach('a', 'dl', cap), breach('b', 'dl', cap), breach('e', 'sq', 'Squat: RPE 7 or easier')],
        exercises,
        (id) => names[id],
      ),
    ).toEqual([`Deadlift, sets 1, 2 and 3: ${cap}`, 'Back squat, set 2: Squat: RPE 7 or easier']);
  });

  it('a reason for a set the session no longer has still shows, with the exercise', () => {
    expect(holdLines([breach('gone', 'dl', 'Hinge: not allowed')], exercises, (id) => names[id])).toEqual(['Deadlift: Hinge: not allowed']);
  });
});
