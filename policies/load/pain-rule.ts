import { requireInRange } from './guard';
import { DEFAULT_PAIN_CEILING } from './patterns';

/**
 * The pain-monitoring model (Silbernagel et al. 2007, AJSM 35:897–906), with the ceiling set by the
 * clinician (default 5), as published:
 * 1. pain during activity at or under the ceiling;
 * 2. pain after activity (that evening) at or under the ceiling, and settled by the next morning;
 * 3. pain the next morning not above the pre-session level;
 * 4. no rise from week to week: one week's rise over the week before is enough to act on.
 * "Settled by next morning" and "not above the pre-session level" are both read as "back at or under
 * where it started": when the evening score is known the flag says the evening pain had not settled,
 * otherwise it says the morning was above the pre-session level — one comparison, one flag.
 * Built for tendon and knee pain; for the back, the clinician sets the ceiling (often lower).
 */
export type PainFlagKind =
  'during_over_ceiling' | 'after_over_ceiling' | 'not_settled_next_morning' | 'next_morning_above_baseline' | 'weekly_rise';

/** The model's own ceiling (Silbernagel et al. 2007, AJSM 35:897–906: pain up to 5/10 allowed). */
export const MODEL_PAIN_CEILING = 5;

export interface PainRuleInput {
  ceiling?: number;
  /** Pain during the session, 0–10. */
  during: number | null;
  /** Pain before the session (the baseline), 0–10. */
  before: number | null;
  /** Pain after the session (that evening), 0–10, once reported. */
  after?: number | null;
  /** Pain the next morning, 0–10, once reported. */
  nextMorning: number | null;
  /** Mean pain-during of the recent weeks, oldest first (two or more for a week-to-week comparison). */
  weeklyMeans?: number[];
}

export interface PainRuleResult {
  action: 'keep' | 'reduce';
  flags: { kind: PainFlagKind; message: string }[];
  /** What the athlete reads. */
  athleteMessage: string;
}

/** Rounds a weekly mean for a sentence (one decimal, no trailing ".0"). */
const oneDecimal = (n: number) => String(Math.round(n * 10) / 10);

/**
 * A rise from week to week: the latest week's mean is higher than the week before it. The model asks
 * for no rise at all (Silbernagel et al. 2007), so one rise is enough; a single week cannot rise.
 * Each mean is on the 0–10 scale; one that is not is a LoadInputError.
 */
export function isWeeklyRise(weeklyMeans: number[]): boolean {
  weeklyMeans.forEach((m, i) => requireInRange(`weekly mean ${i + 1}`, m, 0, 10));
  if (weeklyMeans.length < 2) return false;
  const [previous, latest] = weeklyMeans.slice(-2);
  return latest > previous;
}

/**
 * The warning a clinician reads when a stage's pain ceiling is above the model's 5 (Silbernagel et
 * al. 2007, AJSM 35:897–906). A warning, not a refusal: the ceiling is the clinician's decision.
 */
export function ceilingWarning(ceiling: number | null | undefined): string | null {
  if (ceiling === null || ceiling === undefined || !Number.isFinite(ceiling) || ceiling <= MODEL_PAIN_CEILING) return null;
  return `A ceiling of ${ceiling}/10 is above the pain-monitoring model's ceiling of ${MODEL_PAIN_CEILING}/10 (Silbernagel et al. 2007). Loadline will use ${ceiling}, as you set it.`;
}

/** A pain score or ceiling on the 0–10 scale, or null for "not reported"; anything else is a LoadInputError. */
function painScore(field: string, v: number | null | undefined): number | null {
  return v === null || v === undefined ? null : requireInRange(field, v, 0, 10);
}

/**
 * The rule's verdict on what is known so far. Every score is on the 0–10 numeric rating scale: a
 * score or ceiling that is not a number, or is off the scale, is a LoadInputError (cannot compute)
 * rather than a silent "keep". A score not reported yet (null) answers no condition.
 */
export function evaluatePain(raw: PainRuleInput): PainRuleResult {
  const ceiling = requireInRange('pain ceiling', raw.ceiling ?? DEFAULT_PAIN_CEILING, 0, 10);
  const during = painScore('pain during', raw.during);
  const before = painScore('pain before', raw.before);
  const after = painScore('pain after', raw.after);
  const nextMorning = painScore('next-morning pain', raw.nextMorning);
  const flags: PainRuleResult['flags'] = [];
  if (during !== null && during > ceiling) {
    flags.push({ kind: 'during_over_ceiling', message: `Pain during training was ${during}/10, above the ceiling of ${ceiling}.` });
  }
  if (after !== null && after > ceiling) {
    flags.push({
      kind: 'after_over_ceiling',
      message: `Pain after the session (that evening) was ${after}/10, above the ceiling of ${ceiling}.`,
    });
  }
  if (nextMorning !== null && before !== null && nextMorning > before) {
    flags.push(
      after !== null && after > before
        ? {
            kind: 'not_settled_next_morning',
            message: `Pain after the session (${after}/10 that evening) had not settled by the next morning: ${nextMorning}/10, above the ${before}/10 before the session.`,
          }
        : {
            kind: 'next_morning_above_baseline',
            message: `Next-morning pain was ${nextMorning}/10, above the ${before}/10 before the session.`,
          },
    );
  }
  if (raw.weeklyMeans && isWeeklyRise(raw.weeklyMeans)) {
    const [previous, latest] = raw.weeklyMeans.slice(-2);
    flags.push({
      kind: 'weekly_rise',
      message: `Pain during training rose from week to week: an average of ${oneDecimal(latest)}/10 this week against ${oneDecimal(previous)}/10 the week before.`,
    });
  }
  return verdict(flags, ceiling);
}

/** The action and the athlete's words for a set of failed conditions. */
function verdict(flags: PainRuleResult['flags'], ceiling: number): PainRuleResult {
  const action = flags.length ? 'reduce' : 'keep';
  let athleteMessage = 'Pain stayed within your limits. Keep going as planned.';
  if (flags.some((f) => f.kind === 'during_over_ceiling')) {
    athleteMessage = `Stop the set and tell your clinician: pain went above ${ceiling}/10, the ceiling your clinician set.`;
  } else if (flags.length) {
    athleteMessage = 'Your pain response says to ease off. Your next session should be lighter; your clinician and coach have been told.';
  }
  return { action, flags, athleteMessage };
}

/**
 * The verdict without conditions already judged (and flagged) at an earlier step of the same log,
 * so a later report does not raise the same finding twice.
 */
export function withoutJudged(result: PainRuleResult, judged: readonly PainFlagKind[], ceiling: number): PainRuleResult {
  return verdict(
    result.flags.filter((f) => !judged.includes(f.kind)),
    ceiling,
  );
}
