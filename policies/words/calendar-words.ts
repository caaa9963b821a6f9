import { describeRule } from '../load/describe';
import { describeRuleOnTheBar, type DayInWords } from '../load/day-words';
import type { InForce, PlanStage } from '../load/in-force';
import { MOVEMENT_PATTERNS, STATUS_LABELS, type ParticipationStatus } from '../load/patterns';
import type { Unit } from '../schemas/common';

/**
 * The words of a private calendar feed (iCalendar, RFC 5545). A feed leaves the app for a phone's calendar
 * and whatever service syncs it, so it carries the session and what is limited that day — the
 * engine's own words (day-words.ts, describe.ts) — and never a diagnosis, a body region, a pain
 * report or a note. Every entry ends by pointing back to the app, which stays the record.
 */
export interface EntryText {
  summary: string;
  description: string;
}

const SEE_APP = "Open Loadline for the details; your clinician's advice comes first.";

/** An athlete's session: its title, and the day's limits as "My week" says them. */
export function athleteSessionText(title: string, day: DayInWords, held: boolean): EntryText {
  const lines: string[] = [];
  if (held) lines.push('On hold: your coach is changing this session to fit your limits. Do not train it as written.');
  lines.push(day.headline);
  if (day.mayNot.length) lines.push(`Not for now: ${day.mayNot.join('; ')}.`);
  for (const w of day.withLimits) lines.push(`With limits: ${w}.`);
  if (day.free) lines.push(day.free);
  if (day.pain) lines.push(day.pain);
  lines.push(SEE_APP);
  return { summary: held ? `On hold: ${title}` : title, description: lines.join('\n') };
}

const SEE_APP_FAMILY = "Open Loadline to see what they may do that day; the clinician's advice comes first.";

/**
 * A session in a guardian's feed: the athlete's first name and the session's title, and whether the
 * coach has it on hold. No limits, status or stage: a family calendar is often shared with the whole
 * household, so what the athlete may do stays in the app, where the guardian reads it signed in.
 */
export function guardianSessionText(firstName: string, title: string, held: boolean): EntryText {
  const lines: string[] = [];
  if (held) lines.push(`On hold: the coach is changing this session for ${firstName}. It is not to be trained as written.`);
  lines.push(SEE_APP_FAMILY);
  return { summary: `${firstName}: ${held ? `On hold: ${title}` : title}`, description: lines.join('\n') };
}

/** "Stage 2 of 3: Build", or the number alone when the clinician named none. */
export function stageSummary(label: string | null | undefined, index: number, count: number): string {
  const name = label?.trim();
  return `Stage ${index + 1} of ${count}${name ? `: ${name}` : ''}`;
}

/** A stage of a restriction plan as an entry spanning its days: its limits, load caps as a load for the bar. */
export function stageText(
  stage: Pick<PlanStage, 'label' | 'patterns' | 'painCeiling'>,
  index: number,
  count: number,
  unit: Unit,
): EntryText {
  const lines: string[] = [];
  for (const p of MOVEMENT_PATTERNS) {
    const rule = stage.patterns[p];
    if (rule && rule.mode !== 'free') lines.push(describeRuleOnTheBar(p, rule, unit));
  }
  if (lines.length === 0) lines.push('No movement limits in this stage.');
  lines.push(`Stop and tell your clinician if pain goes past ${stage.painCeiling}/10.`);
  lines.push(SEE_APP);
  return { summary: stageSummary(stage.label, index, count), description: lines.join('\n') };
}

/** One athlete's line in a coach's entry: status and limits in the staff's words (as the roster). */
export function coachAthleteLine(
  name: string,
  status: ParticipationStatus,
  inForce: Pick<InForce, 'patterns'>,
  unit: Unit,
  held: boolean,
): string {
  const limits = MOVEMENT_PATTERNS.filter((p) => inForce.patterns[p].mode !== 'free').map((p) =>
    describeRule(p, inForce.patterns[p], unit, 'staff'),
  );
  const parts = [STATUS_LABELS[status], ...(held ? ['session on hold'] : []), ...limits];
  return `${name}: ${parts.join('; ')}`;
}

/** A coach's entry: the session, then each athlete in it with what is limited that day. */
export function coachSessionText(title: string, athletes: { name: string; line: string }[], team: boolean): EntryText {
  const summary = team ? `${title} (team)` : athletes.length === 1 ? `${athletes[0].name}: ${title}` : title;
  return { summary, description: [...athletes.map((a) => a.line), SEE_APP].join('\n') };
}
