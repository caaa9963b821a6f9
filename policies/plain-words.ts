/**
 * What a restriction plan means, in the everyday words a family reads — never the trade's words
 * ("hinge", "RPE", "1RM", "rotation", "sets", "reps", "%"). Pure and stable: the notices use it, and
 * the clearance letter may too.
 *
 * Every line is person-neutral ("no lifting heavy things from the floor"), so the same words read
 * right in a note to the athlete ("you") and to their guardian ("Maya"). Numbers are rounded the way
 * that never allows more than the clinician did (common practice: under a cap, round towards the safe
 * side — loads down, effort left in reserve up).
 *
 * API:
 * - `PLAIN_PATTERNS` — for each movement pattern, the activity and its "not allowed" wording.
 * - `plainCap(key, value, unit)` — one cap in plain words, or null when it limits nothing.
 * - `plainPatternLimit(pattern, rule, unit)` — one pattern's rule as one sentence.
 * - `plainLimitLines(limits, unit)` — a plan stage (or the limits in force on a day) as sentences.
 * - `plainPainCeiling(ceiling)` — the stage's pain ceiling as a sentence.
 * - `plainStatus(status)` — what a participation status means for the day.
 * - `plainCriterion(criterion)` / `plainCriterionProgress(result)` — what unlocks the next stage and how far along it is.
 */
import type { Unit } from './schemas/common';
import { isFiniteNumber } from './load/guard';
import { readPainCeiling } from './load/in-force';
import { MOVEMENT_PATTERNS, type CapKey, type MovementPattern, type ParticipationStatus, type PatternRule } from './load/patterns';
import { capOnTheBarWords } from './load/bar-cap';
import type { CriterionResult, StageCriterion } from './load/stage-criteria';

export interface PlainPattern {
  /** The activity, to start a sentence: "Lifting things from the floor or bending forward at the hips". */
  activity: string;
  /** The activity not allowed, as a sentence: "No lifting heavy things from the floor or bending forward with weight". */
  blocked: string;
}

/** Our own everyday words for each movement pattern (common practice: describe what the body does, not the exercise family). */
export const PLAIN_PATTERNS: Record<MovementPattern, PlainPattern> = {
  hinge: {
    activity: 'Lifting things from the floor or bending forward at the hips',
    blocked: 'No lifting heavy things from the floor or bending forward with weight',
  },
  squat: {
    activity: 'Squatting down and standing back up with weight',
    blocked: 'No squatting down and standing up with weight',
  },
  lunge: {
    activity: 'Stepping forward, back or up onto one leg',
    blocked: 'No stepping exercises or exercises on one leg',
  },
  horizontal_push: {
    activity: 'Pushing weight away from the chest, as in push-ups',
    blocked: 'No pushing weight away from the chest (no push-ups or chest presses)',
  },
  vertical_push: {
    activity: 'Pushing weight up over the head',
    blocked: 'No pushing weight up over the head',
  },
  horizontal_pull: {
    activity: 'Pulling weight in towards the chest, as in rowing',
    blocked: 'No pulling weight in towards the chest',
  },
  vertical_pull: {
    activity: 'Pulling down from above or pulling the body up to a bar',
    blocked: 'No pulling down from above and no pull-ups',
  },
  carry: {
    activity: 'Walking while carrying something heavy',
    blocked: 'No carrying heavy things while walking',
  },
  rotation: {
    activity: 'Twisting the body, or holding it still against a twist',
    blocked: 'No twisting the body under effort, and no exercises that hold it still against a twist',
  },
  jump: {
    activity: 'Jumping and landing',
    blocked: 'No jumping or landing',
  },
  sprint: {
    activity: 'Running at full speed',
    blocked: 'No running at full speed',
  },
  throw: {
    activity: 'Throwing',
    blocked: 'No throwing',
  },
  swing: {
    activity: 'Swinging a weight between the legs and up',
    blocked: 'No swinging weights',
  },
};

/**
 * A share of the most someone can lift once, said as a common fraction rounded down (so the words
 * never allow more than the cap): 60 → "three fifths", 50 → "half", 75 → "three quarters".
 */
const FRACTIONS: [number, string][] = [
  [1, 'all'],
  [0.9, 'nine tenths'],
  [0.8, 'four fifths'],
  [0.75, 'three quarters'],
  [0.7, 'seven tenths'],
  [2 / 3, 'two thirds'],
  [0.6, 'three fifths'],
  [0.5, 'half'],
  [0.4, 'two fifths'],
  [1 / 3, 'a third'],
  [0.3, 'three tenths'],
  [0.25, 'a quarter'],
  [0.2, 'a fifth'],
  [0.1, 'a tenth'],
];

function shareWords(percent: number): string | null {
  const share = percent / 100;
  // A hair of tolerance so 66.67 (two thirds typed as a number) still reads "two thirds".
  return FRACTIONS.find(([f]) => f <= share + 1e-3)?.[1] ?? null;
}

/** A stored cap that is not a finite number of 0 or more is read as 0, as the engine reads it (nothing passes). */
const readCap = (v: unknown) => (isFiniteNumber(v) && v >= 0 ? v : 0);

/**
 * One cap in plain words, or null when the cap limits nothing worth saying (impact allowed).
 * Effort follows the reps-in-reserve scale (Zourdos et al. 2016, JSCR 30:267–275: RPE = 10 − reps in
 * reserve); a half step left in reserve is said as the next whole one up, the stricter reading.
 */
export function plainCap(key: CapKey, value: number | boolean, unit: Unit): string | null {
  if (key === 'impactAllowed')
    return value === false ? 'nothing fast or jarring while doing it (no throwing, jumping or landing with it)' : null;
  const n = readCap(value);
  switch (key) {
    case 'maxPercent1RM': {
      const words = shareWords(n);
      return words === null
        ? 'only very light weights, well under a tenth of the most that can be lifted once'
        : words === 'all'
          ? 'weights up to the most that can be lifted once'
          : `weights no heavier than ${words} of the most that can be lifted once`;
    }
    case 'maxLoadKg': {
      // A load that can go on the bar, rounded down to the common plate steps (policies/load/bar-cap.ts).
      const words = capOnTheBarWords(n, unit);
      return words.startsWith('up to ') ? `nothing heavier than ${words.slice('up to '.length)}` : words;
    }
    case 'maxRpe': {
      const inReserve = Math.ceil(10 - Math.min(10, n));
      if (inReserve === 0) return 'hard efforts are allowed, up to the most that can be done';
      const effort = inReserve >= 4 ? 'comfortable' : inReserve >= 2 ? 'moderate' : 'hard but controlled';
      return `keep it at a ${effort} effort, able to do ${inReserve} more`;
    }
    case 'maxSetsPerSession':
      return n === 0 ? 'none of it in a training day' : `at most ${n} ${n === 1 ? 'round' : 'rounds'} of it in one training day`;
    case 'maxRepsPerSet':
      return `at most ${n} in a row before a rest`;
    case 'maxHardSetsPerWeek':
      // A hard round is one with 3 or fewer left in reserve (common practice; the engine's "hard set" is RPE 7 or higher).
      return n === 0
        ? 'no tiring efforts this week: always stop with more than 3 left in reserve'
        : `at most ${n} tiring ${n === 1 ? 'round' : 'rounds'} a week (tiring: able to do only 3 or fewer more)`;
  }
}

const CAP_ORDER: CapKey[] = [
  'maxLoadKg',
  'maxPercent1RM',
  'maxRpe',
  'maxSetsPerSession',
  'maxRepsPerSet',
  'maxHardSetsPerWeek',
  'impactAllowed',
];

/** One pattern's rule as one sentence: "No throwing." / "Throwing: no limit." / "Throwing: nothing heavier than 5 kg; …". */
export function plainPatternLimit(pattern: MovementPattern, rule: PatternRule, unit: Unit): string {
  const words = PLAIN_PATTERNS[pattern];
  if (rule.mode === 'blocked') return `${words.blocked}.`;
  if (rule.mode === 'free') return `${words.activity}: no limit.`;
  const parts = CAP_ORDER.filter((k) => rule.caps?.[k] !== undefined && rule.caps?.[k] !== null)
    .map((k) => plainCap(k, rule.caps![k] as number | boolean, unit))
    .filter((p): p is string => p !== null);
  return parts.length ? `${words.activity}: ${parts.join('; ')}.` : `${words.activity}: allowed, with care.`;
}

/** The pain ceiling during training as a sentence (the 0–10 scale of Silbernagel et al. 2007, AJSM 35:897–906). */
export function plainPainCeiling(ceiling: number): string {
  return `Stop and tell the clinician if pain during training goes above ${readPainCeiling(ceiling)} out of 10.`;
}

/** What plainLimitLines reads: a plan stage, or the limits in force on a day (InForce) — both have these fields. */
export interface PlainLimits {
  patterns: Partial<Record<MovementPattern, PatternRule>>;
  painCeiling: number;
}

/**
 * A stage (or the limits in force) as plain sentences: each limited movement in the plans's order,
 * then one line for everything else, then the pain ceiling. A pattern left out of a stage is free.
 */
export function plainLimitLines(limits: PlainLimits, unit: Unit): string[] {
  const limited = MOVEMENT_PATTERNS.filter((p) => limits.patterns[p] && limits.patterns[p]!.mode !== 'free');
  const lines = limited.map((p) => plainPatternLimit(p, limits.patterns[p]!, unit));
  lines.push(limited.length ? 'Everything else: no limit.' : 'No limit on any kind of movement.');
  lines.push(plainPainCeiling(limits.painCeiling));
  return lines;
}

/** What a participation status means, as the end of "… is now": Out, Limited or Full in everyday words. */
export function plainStatus(status: ParticipationStatus): string {
  switch (status) {
    case 'out':
      return 'not training for now, until the clinician says training can start again';
    case 'limited':
      return 'training again, with some limits';
    case 'full':
      return 'back to full training, with no limits';
  }
}

/**
 * The trade's words a family should never have to read (common practice: write for a general reader,
 * no unexplained technical terms). Used by the tests of every family text; handy for any new one.
 */
export const TRADE_JARGON = [
  'hinge',
  'RPE',
  'RIR',
  '1RM',
  '%1RM',
  '%',
  'rotation',
  'anti-rotation',
  'plyometric',
  'plyometrics',
  'eccentric',
  'concentric',
  'isometric',
  'sets',
  'reps',
  'rep',
  'AMRAP',
  'tempo',
  'deload',
  'hypertrophy',
  'volume',
  'intensity',
  'load',
  'loads',
  'capped',
  'cap',
  'caps',
  'pattern',
  'breach',
  'estimated',
  'unilateral',
  'posterior chain',
  'lunge',
] as const;

/** The jargon words found in a text: whole words (case ignored), or the sign itself for "%". */
export function jargonIn(text: string): string[] {
  return TRADE_JARGON.filter((term) =>
    /^[\w -]+$/.test(term)
      ? new RegExp(`(^|[^\\w-])${term.replace(/[-\s]/g, (c) => `\\${c === ' ' ? 's' : c}`)}($|[^\\w-])`, 'i').test(text)
      : text.includes(term),
  );
}

const times = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/**
 * One exit criterion of a stage as the athlete and family read it: what has to happen before the next
 * stage. A clinician's check is named in the clinician's own words (its label).
 */
export function plainCriterion(c: StageCriterion): string {
  switch (c.kind) {
    case 'record':
      switch (c.rule) {
        case 'pain_settled_sessions':
          return `${times(c.count ?? 1, 'training day')} in a row with pain during training at ${c.maxPain ?? 0} out of 10 or less, and no worse the next morning than before training.`;
        case 'no_red_flags':
          return 'No warning signs reported since this stage began.';
        case 'sessions_logged':
          return `${times(c.count ?? 1, 'training day')} recorded in this stage.`;
        case 'rpe_at_most':
          return `${times(c.count ?? 1, 'planned training day')} in a row that felt no harder than ${c.maxRpe ?? 0} out of 10.`;
      }
      break;
    case 'clinician':
      return `A check with the clinician: ${c.label}.`;
    case 'athlete':
      return `Feeling ready to move on: at least ${c.threshold} out of 10 when asked.`;
  }
}

/** How far along one criterion is, in plain words. */
export function plainCriterionProgress(r: Pick<CriterionResult, 'state' | 'have' | 'need' | 'kind'>): string {
  if (r.state === 'met') return 'Done.';
  if (r.need > 1) return `${r.have} of ${r.need} so far.`;
  if (r.state === 'waiting') return r.kind === 'athlete' ? 'Not answered yet in this stage.' : 'Not checked yet in this stage.';
  return 'Not yet.';
}
