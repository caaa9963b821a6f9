import type { Breach } from '../load/breach';
import type { MovementPattern } from '../load/patterns';

/** Each movement pattern as the thing an athlete does, for "over the limit for …". */
const PATTERN_DOING: Record<MovementPattern, string> = {
  hinge: 'hinging',
  squat: 'squatting',
  lunge: 'lunges and single-leg work',
  horizontal_push: 'horizontal pushing',
  vertical_push: 'overhead pushing',
  horizontal_pull: 'horizontal pulling',
  vertical_pull: 'vertical pulling',
  carry: 'carries',
  rotation: 'rotation work',
  jump: 'jumps and landings',
  sprint: 'sprinting',
  throw: 'throwing',
  swing: 'swings',
};

/**
 * What is over which limit, in one line a coach reads first: "Back squat 120 kg × 5 is over the
 * 100 kg limit for squatting." The engine's message beneath it keeps the detail and the fix. Null for
 * breaches that are not about a number over a limit (blocked, impact, Out, unreadable, no baseline):
 * their message already says it plainly.
 */
export function breachHeadline(breach: Breach, exerciseName: string, reps?: number): string | null {
  if (!breach.pattern) return null;
  const doing = PATTERN_DOING[breach.pattern];
  const times = reps !== undefined ? ` × ${reps}` : '';
  switch (breach.rule) {
    case 'absolute_load':
    case 'percent_1rm': {
      // The limit reads "max 100 kg" or "max 60% of 140 kg = 84 kg": the load limit is its last number.
      const match = /^max (?:(\d+(?:\.\d+)?% of .+) = )?(.+)$/.exec(breach.limit);
      if (!match || !/\d/.test(breach.planned) || breach.planned.endsWith('%')) return null;
      const [, percentOf, cap] = match;
      return `${exerciseName} ${breach.planned}${times} is over the ${cap} limit${percentOf ? ` (${percentOf})` : ''} for ${doing}.`;
    }
    case 'rpe':
    case 'reps_per_set':
    case 'sets_per_session':
    case 'hard_sets_per_week':
      return `${exerciseName}: ${breach.planned} is over the limit for ${doing} (${breach.limit}).`;
    default:
      return null;
  }
}
