import type { Unit } from '../schemas/common';
import { isFiniteNumber, isIsoDate } from './guard';
import { PATTERN_LABELS, type Caps, type MovementPattern, type PatternRule } from './patterns';
import { formatLoad } from './units';

/** Who reads the words: athletes and guardians ("your best lift") or staff ("estimated 1RM"). */
export type Voice = 'athlete' | 'staff';

/**
 * Caps in plain words: "up to 60% of your best lift, effort RPE 7 or easier". A cap that is not a
 * finite number of 0 or more is said as 0, as the engine reads it (nothing passes it).
 */
export function describeCaps(caps: Caps | undefined, unit: Unit, voice: Voice = 'athlete'): string[] {
  if (!caps) return [];
  const c = (v: unknown) => (isFiniteNumber(v) && v >= 0 ? v : 0);
  const parts: string[] = [];
  if (caps.maxPercent1RM !== undefined)
    parts.push(`up to ${c(caps.maxPercent1RM)}% of ${voice === 'staff' ? 'estimated 1RM' : 'your best lift'}`);
  if (caps.maxLoadKg !== undefined) parts.push(`no more than ${formatLoad(c(caps.maxLoadKg), unit, 'down')}`);
  if (caps.maxRpe !== undefined) parts.push(`effort RPE ${c(caps.maxRpe)} or easier`);
  if (caps.maxSetsPerSession !== undefined) parts.push(`at most ${c(caps.maxSetsPerSession)} sets a session`);
  if (caps.maxRepsPerSet !== undefined) parts.push(`at most ${c(caps.maxRepsPerSet)} reps a set`);
  if (caps.maxHardSetsPerWeek !== undefined) parts.push(`at most ${c(caps.maxHardSetsPerWeek)} hard sets a week`);
  if (caps.impactAllowed === false) parts.push('no explosive or impact work in this movement (throws, jumps, landings)');
  return parts;
}

export function describeRule(pattern: MovementPattern, rule: PatternRule, unit: Unit, voice: Voice = 'athlete'): string {
  const name = PATTERN_LABELS[pattern];
  if (rule.mode === 'blocked') return `${name}: not allowed for now`;
  if (rule.mode === 'free') return `${name}: no limits`;
  const parts = describeCaps(rule.caps, unit, voice);
  return parts.length ? `${name}: ${parts.join(', ')}` : `${name}: allowed with care`;
}

/** What describeDate says for a date that is not a calendar day as YYYY-MM-DD. */
export const UNKNOWN_DATE = 'an unknown date';

/** '2026-03-14' → '14 March 2026', without time zones getting in the way. */
export function describeDate(iso: string): string {
  if (!isIsoDate(iso)) return UNKNOWN_DATE;
  const [y, m, d] = iso.split('-').map(Number);
  const months = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'];
  return `${d} ${months[m - 1]} ${y}`;
}
