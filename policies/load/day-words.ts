import type { Unit } from '../schemas/common';
import { capOnTheBarWords } from './bar-cap';
import { describeCaps, describeRule } from './describe';
import type { InForce } from './in-force';
import { MOVEMENT_PATTERNS, PATTERN_LABELS, type Caps, type MovementPattern, type ParticipationStatus, type PatternRule } from './patterns';

/** Each movement pattern as an athlete says it; the trade's name stays in brackets for talking to the coach. */
const EVERYDAY: Record<MovementPattern, string> = {
  hinge: 'lifting from the floor and bending at the hips',
  squat: 'squatting',
  lunge: 'lunges and one-leg work',
  horizontal_push: 'pushing forwards (push-ups, bench press)',
  vertical_push: 'pushing overhead',
  horizontal_pull: 'pulling towards you (rows)',
  vertical_pull: 'pulling down or up (pull-ups)',
  carry: 'carrying weights',
  rotation: 'twisting, and holding still against a twist',
  jump: 'jumping and landing',
  sprint: 'sprinting',
  throw: 'throwing',
  swing: 'swings',
};

export const patternInWords = (p: MovementPattern) => `${EVERYDAY[p]} (${PATTERN_LABELS[p].toLowerCase()})`;

/** What an athlete may and may not do on one day, in their words, loads as they can load the bar. */
export interface DayInWords {
  /** One line for the day: Out, limits, or no limits. */
  headline: string;
  mayNot: string[];
  withLimits: string[];
  /** The patterns with no limit, in one line; null when every pattern is limited. */
  free: string | null;
  /** The pain ceiling in force, when a plan covers the day. */
  pain: string | null;
}

/** A cap in the athlete's words, the load one rounded down to what they can put on the bar. */
export function capsOnTheBar(caps: Caps | undefined, unit: Unit, step?: number): string[] {
  if (!caps) return [];
  const rest = describeCaps({ ...caps, maxLoadKg: undefined }, unit, 'athlete');
  return caps.maxLoadKg === undefined ? rest : [capOnTheBarWords(caps.maxLoadKg, unit, step), ...rest];
}

/**
 * describeRule (describe.ts) for the athlete's and family's screens of today: the same words, with a
 * load cap as a load they can put on the bar ("Hinge: up to 95 lb", not "no more than 99.2 lb").
 */
export function describeRuleOnTheBar(pattern: MovementPattern, rule: PatternRule, unit: Unit): string {
  const name = PATTERN_LABELS[pattern];
  if (rule.mode !== 'capped') return describeRule(pattern, rule, unit);
  const parts = capsOnTheBar(rule.caps, unit);
  return parts.length ? `${name}: ${parts.join(', ')}` : `${name}: allowed with care`;
}

/**
 * The day for the athlete: the limits of the plan stages covering it and the participation status
 * on it. Out with no plan means no training; a day no stage covers has no movement limits.
 */
export function dayInWords(
  inForce: Pick<InForce, 'patterns' | 'painCeiling' | 'stages'>,
  status: ParticipationStatus,
  unit: Unit,
): DayInWords {
  const pain = inForce.stages.length ? `Stop and tell your clinician if pain goes past ${inForce.painCeiling}/10.` : null;
  if (status === 'out' && inForce.stages.length === 0) {
    return { headline: 'Out: no training until your clinician says what you may do.', mayNot: [], withLimits: [], free: null, pain };
  }
  const mayNot: string[] = [];
  const withLimits: string[] = [];
  const free: MovementPattern[] = [];
  for (const p of MOVEMENT_PATTERNS) {
    const rule = inForce.patterns[p];
    if (rule.mode === 'blocked') mayNot.push(patternInWords(p));
    else if (rule.mode === 'capped') {
      const caps = capsOnTheBar(rule.caps, unit);
      withLimits.push(`${patternInWords(p)}: ${caps.length ? caps.join(', ') : 'with care'}`);
    } else free.push(p);
  }
  const limited = mayNot.length + withLimits.length > 0;
  const headline =
    status === 'out'
      ? 'Out: only what your clinician lists here.'
      : limited
        ? 'Some movements have limits today.'
        : status === 'limited'
          ? 'No movement limits, but follow what your clinician told you.'
          : 'No limits.';
  const freeLine = !limited ? null : free.length ? `No limit on everything else: ${free.map((p) => EVERYDAY[p]).join(', ')}.` : null;
  return { headline, mayNot, withLimits, free: freeLine, pain };
}
