import { MOVEMENT_PATTERNS, type Caps, type MovementPattern, type ParticipationStatus, type PatternRule } from './load/patterns';

/**
 * What a signed letter rests on: the participation status and the limit of every movement pattern
 * that is not free, as they stood on the letter's first day in force when it was signed. Kept as data,
 * not as the printed words, so a plainer wording of the same limits never makes a letter look stale.
 */
export interface LetterBasis {
  status: ParticipationStatus;
  patterns: Partial<Record<MovementPattern, PatternRule>>;
}

const CAP_KEYS: (keyof Caps)[] = [
  'maxPercent1RM',
  'maxLoadKg',
  'maxRpe',
  'maxSetsPerSession',
  'maxRepsPerSet',
  'maxHardSetsPerWeek',
  'impactAllowed',
];

/** Only the caps that are set, in one fixed order: two equal limits give equal bases. */
function plainRule(rule: PatternRule): PatternRule {
  if (rule.mode !== 'capped') return { mode: rule.mode };
  const caps: Caps = {};
  for (const k of CAP_KEYS)
    if (rule.caps?.[k] !== undefined && rule.caps?.[k] !== null) (caps as Record<string, unknown>)[k] = rule.caps[k];
  return { mode: 'capped', caps };
}

export function letterBasis(status: ParticipationStatus, patterns: Record<MovementPattern, PatternRule>): LetterBasis {
  const limited: Partial<Record<MovementPattern, PatternRule>> = {};
  for (const p of MOVEMENT_PATTERNS) if (patterns[p].mode !== 'free') limited[p] = plainRule(patterns[p]);
  return { status, patterns: limited };
}

/** Whether a letter resting on `signed` still states what is in force now (`now`). */
export function sameBasis(signed: LetterBasis, now: LetterBasis): boolean {
  if (signed.status !== now.status) return false;
  return MOVEMENT_PATTERNS.every((p) => {
    const a = signed.patterns[p];
    const b = now.patterns[p];
    if (!a || !b) return !a && !b;
    return JSON.stringify(plainRule(a)) === JSON.stringify(plainRule(b));
  });
}
