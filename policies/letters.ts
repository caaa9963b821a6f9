import { plainPatternLimit } from './plain-words';
import { MOVEMENT_PATTERNS, type MovementPattern, type PatternRule } from './load/patterns';
import type { Unit } from './schemas/common';

const credentialParts = (s: string) =>
  s
    .split(',')
    .map((p) => p.trim())
    .filter(Boolean);

/**
 * "Priya Raman, ATC": the clinician's name with the credential, printed once. People often keep a
 * credential in their display name ("Priya Raman, ATC") and then type it again in the letter form
 * ("Athletic trainer, ATC", as the form's example reads): each comma-separated part of the credential
 * that the name already carries is left out, so no part is printed twice.
 */
export function nameWithCredential(name: string, credential: string): string {
  const has = new Set(credentialParts(name).map((p) => p.toLowerCase()));
  const extra = credentialParts(credential).filter((p) => {
    const key = p.toLowerCase();
    if (has.has(key)) return false;
    has.add(key);
    return true;
  });
  return extra.length ? `${name}, ${extra.join(', ')}` : name;
}

/**
 * The limit lines a clearance letter prints: one line for each movement pattern that is not free, in
 * plain everyday words (policies/plain-words.ts: a letter is read by the family, never "hinge" or
 * "RPE") and in the family's unit (loads rounded down, so a line never allows more than the cap). The letter's
 * wording lives here and only here, so a plainer wording changes every letter, its preview and the
 * updated-letter form at once.
 */
export function letterLimitLines(patterns: Record<MovementPattern, PatternRule>, unit: Unit): string[] {
  return MOVEMENT_PATTERNS.filter((p) => patterns[p].mode !== 'free').map((p) => plainPatternLimit(p, patterns[p], unit));
}

/**
 * A signed letter as the standing rule needs it: when it starts, when it was signed (an ISO instant) and
 * the last day it is valid (its next review; null when the clinician set none).
 */
export interface SignedLetterDates {
  id: string;
  effectiveFrom: string;
  signedAt: string;
  validUntil: string | null;
}

export type LetterStanding =
  | { status: 'signed'; supersededBy: null }
  | { status: 'scheduled'; supersededBy: null }
  | { status: 'expired'; supersededBy: null }
  | { status: 'superseded'; supersededBy: string };

const signedBefore = (a: SignedLetterDates, b: SignedLetterDates) => a.signedAt < b.signedAt || (a.signedAt === b.signedAt && a.id < b.id);

/**
 * Where a signed letter stands on `today` (YYYY-MM-DD), among all the athlete's signed letters.
 * A letter signed later replaces every earlier-signed one from the later letter's start date, not from
 * the moment of signing: until then the earlier letter stays in force and the later one is scheduled.
 * So on any day the letter in force is the latest-signed one that has started, and at most one is.
 * A letter replaced before its own start date (a later-signed letter starts sooner) is superseded
 * without ever having been in force. `supersededBy` names the letter that took over from it: the first
 * to start (of two starting the same day, the later-signed one, which is the one in force).
 * A letter that would be in force but whose valid-until day has passed is expired: it is still the latest
 * letter, so it keeps any earlier one replaced, but nothing is in force until a new letter is signed.
 * The valid-until day itself is still covered.
 */
export function letterStanding(letter: SignedLetterDates, athleteLetters: readonly SignedLetterDates[], today: string): LetterStanding {
  let by: SignedLetterDates | null = null;
  for (const other of athleteLetters) {
    if (other.id === letter.id || !signedBefore(letter, other) || other.effectiveFrom > today) continue;
    if (!by || other.effectiveFrom < by.effectiveFrom || (other.effectiveFrom === by.effectiveFrom && signedBefore(by, other))) by = other;
  }
  if (by) return { status: 'superseded', supersededBy: by.id };
  if (letter.effectiveFrom > today) return { status: 'scheduled', supersededBy: null };
  if (letter.validUntil !== null && letter.validUntil < today) return { status: 'expired', supersededBy: null };
  return { status: 'signed', supersededBy: null };
}
