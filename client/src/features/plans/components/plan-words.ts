import type { Unit } from '../../../../../policies/schemas';
import { PATTERN_LABELS, type Caps, type MovementPattern } from '../../../../../policies/load/patterns';
import { formatLoad } from '../../../../../policies/load/units';
import { formatDate } from '../../../lib/format';
import type { NumberCapField } from './plan-form';

/** Column headings and the words after the pattern name in each cap input's accessible name. */
export const CAP_COLUMNS: { field: NumberCapField | 'impactAllowed'; heading: (unit: Unit) => string; name: string }[] = [
  { field: 'maxPercent1RM', heading: () => '% of 1RM', name: 'max % of 1RM' },
  { field: 'maxLoad', heading: (unit) => `Load (${unit})`, name: 'max load' },
  { field: 'maxRpe', heading: () => 'RPE', name: 'max RPE' },
  { field: 'maxSetsPerSession', heading: () => 'Sets / session', name: 'max sets per session' },
  { field: 'maxRepsPerSet', heading: () => 'Reps / set', name: 'max reps per set' },
  { field: 'maxHardSetsPerWeek', heading: () => 'Hard sets / week', name: 'max hard sets per week' },
  { field: 'impactAllowed', heading: () => 'Impact', name: 'impact allowed' },
];

/** Caps in a staff table's short words: "≤60% 1RM · ≤40 kg · RPE ≤7 · no impact". */
export function capsShort(caps: Caps | undefined, unit: Unit): string {
  if (!caps) return '';
  const parts: string[] = [];
  if (caps.maxPercent1RM !== undefined) parts.push(`≤${caps.maxPercent1RM}% 1RM`);
  if (caps.maxLoadKg !== undefined) parts.push(`≤${formatLoad(caps.maxLoadKg, unit)}`);
  if (caps.maxRpe !== undefined) parts.push(`RPE ≤${caps.maxRpe}`);
  if (caps.maxSetsPerSession !== undefined) parts.push(`≤${caps.maxSetsPerSession} sets/session`);
  if (caps.maxRepsPerSet !== undefined) parts.push(`≤${caps.maxRepsPerSet} reps/set`);
  if (caps.maxHardSetsPerWeek !== undefined) parts.push(`≤${caps.maxHardSetsPerWeek} hard sets/week`);
  if (caps.impactAllowed !== undefined) parts.push(caps.impactAllowed ? 'impact allowed' : 'no impact');
  return parts.join(' · ');
}

export function patternList(patterns: MovementPattern[]): string {
  return patterns.map((p) => PATTERN_LABELS[p].toLowerCase()).join(', ');
}

export function dateRange(start: string, end: string): string {
  return `${formatDate(start)} – ${formatDate(end)}`;
}

/** Days in an inclusive date range, counted on the calendar (no time zones involved). */
export function daysInclusive(start: string, end: string): number {
  const toDay = (iso: string) => {
    const [y, m, d] = iso.split('-').map(Number);
    return Date.UTC(y, m - 1, d) / 86_400_000;
  };
  return toDay(end) - toDay(start) + 1;
}
