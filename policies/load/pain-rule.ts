import { requireInRange } from './guard';
import { DEFAULT_PAIN_CEILING } from './patterns';

/**
 * The pain-monitoring rule (Silbernagel et al. 2007, AJSM 35:897–906), with the ceiling set by the
 * clinician (default 5): pain during activity at or under the ceiling is acceptable; the next
 * morning it must be back at (or under) the pre-session level; and pain must not trend upward week
 * to week. Built for tendon and knee pain; for the back, the clinician sets the ceiling.
 */
export type PainFlagKind = 'during_over_ceiling' | 'next_morning_above_baseline' | 'rising_trend';

export interface PainRuleInput {
  ceiling?: number;
  /** Pain during the session, 0–10. */
  during: number | null;
  /** Pain before the session (the baseline), 0–10. */
  before: number | null;
  /** Pain the next morning, 0–10, once reported. */
  nextMorning: number | null;
  /** Mean pain-during of each of the recent weeks, oldest first (at least two for a trend). */
  weeklyMeans?: number[];
}

export interface PainRuleResult {
  action: 'keep' | 'reduce';
  flags: { kind: PainFlagKind; message: string }[];
  /** What the athlete reads. */
  athleteMessage: string;
}

/**
 * A rising trend: each of the last three weekly means is higher than the one before (common
 * practice reading of "no rising trend week to week"; two weeks are not a trend). Each mean is on
 * the 0–10 scale; one that is not is a LoadInputError.
 */
export function isRisingTrend(weeklyMeans: number[]): boolean {
  weeklyMeans.forEach((m, i) => requireInRange(`weekly mean ${i + 1}`, m, 0, 10));
  if (weeklyMeans.length < 3) return false;
  const [a, b, c] = weeklyMeans.slice(-3);
  return b > a && c > b;
}

/** A pain score or ceiling on the 0–10 scale, or null for "not reported"; anything else is a LoadInputError. */
function painScore(field: string, v: number | null): number | null {
  return v === null ? null : requireInRange(field, v, 0, 10);
}

/**
 * The rule's verdict. Every score is on the 0–10 numeric rating scale: a score or ceiling that is not
 * a number, or is off the scale, is a LoadInputError (cannot compute) rather than a silent "keep".
 */
export function evaluatePain(raw: PainRuleInput): PainRuleResult {
  const ceiling = requireInRange('pain ceiling', raw.ceiling ?? DEFAULT_PAIN_CEILING, 0, 10);
  const input: PainRuleInput = {
    during: painScore('pain during', raw.during),
    before: painScore('pain before', raw.before),
    nextMorning: painScore('next-morning pain', raw.nextMorning),
    weeklyMeans: raw.weeklyMeans,
  };
  const flags: PainRuleResult['flags'] = [];
  if (input.during !== null && input.during > ceiling) {
    flags.push({ kind: 'during_over_ceiling', message: `Pain during training was ${input.during}/10, above the ceiling of ${ceiling}.` });
  }
  if (input.nextMorning !== null && input.before !== null && input.nextMorning > input.before) {
    flags.push({
      kind: 'next_morning_above_baseline',
      message: `Next-morning pain was ${input.nextMorning}/10, above the ${input.before}/10 before the session.`,
    });
  }
  if (input.weeklyMeans && isRisingTrend(input.weeklyMeans)) {
    flags.push({ kind: 'rising_trend', message: 'Pain during training has risen three weeks in a row.' });
  }
  const action = flags.length ? 'reduce' : 'keep';
  let athleteMessage = 'Pain stayed within your limits. Keep going as planned.';
  if (flags.some((f) => f.kind === 'during_over_ceiling')) {
    athleteMessage = `Stop the set and tell your clinician: pain went above ${ceiling}/10, the ceiling your clinician set.`;
  } else if (flags.length) {
    athleteMessage = 'Your pain response says to ease off. Your next session should be lighter; your clinician and coach have been told.';
  }
  return { action, flags, athleteMessage };
}
