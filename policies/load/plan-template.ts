import { addDays } from '../today';
import type { PlanStage } from './in-force';

/**
 * Plan templates: a restriction plan with its stage dates turned into days counted from the plan's
 * start, so the same stages can start another plan on another day.
 *
 * A stage is copied as a whole, not field by field: whatever a stage carries besides its id and
 * dates (limits, pain ceiling, label, exit criteria) goes into the template and back out unchanged.
 * Only `id`, `startDate`, `endDate` and `reviewDate` are replaced, by fresh ids and by offsets.
 */

/** Fields of a stage that belong to one plan on one calendar; everything else is the stage's content. */
type Dated = 'id' | 'startDate' | 'endDate' | 'reviewDate';

/**
 * One stage of a template. Offsets are whole days after the plan's first day (0 = the start date);
 * both ends are inclusive, as a plan stage's dates are.
 */
export type TemplateStage<S extends PlanStage = PlanStage> = Omit<S, Dated> & {
  startOffset: number;
  endOffset: number;
  reviewOffset?: number | null;
};

/** Whole days from `from` to `to` (`YYYY-MM-DD`, calendar days, no time zone involved); negative when `to` is earlier. */
export function daysBetween(from: string, to: string): number {
  return Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / 86_400_000);
}

/**
 * A plan's stages as template stages, in date order, counted from the earliest stage's start. Gaps
 * between stages are kept as gaps.
 */
export function templateStagesFromPlan<S extends PlanStage>(stages: readonly S[]): TemplateStage<S>[] {
  if (stages.length === 0) return [];
  const sorted = [...stages].sort((a, b) => (a.startDate < b.startDate ? -1 : a.startDate > b.startDate ? 1 : 0));
  const first = sorted[0].startDate;
  return sorted.map((stage) => {
    const { id: _id, startDate, endDate, reviewDate, ...content } = stage;
    const out = {
      ...structuredClone(content),
      startOffset: daysBetween(first, startDate),
      endOffset: daysBetween(first, endDate),
    } as TemplateStage<S>;
    if (reviewDate) out.reviewOffset = daysBetween(first, reviewDate);
    return out;
  });
}

/**
 * A template's stages as the stages of a new plan starting on `startDate`: dates from the offsets,
 * a fresh id for each stage (`newId`, injectable so tests are repeatable), the rest copied whole.
 */
export function planStagesFromTemplate<S extends PlanStage>(
  stages: readonly TemplateStage<S>[],
  startDate: string,
  newId: () => string,
): S[] {
  return stages.map((stage) => {
    const { startOffset, endOffset, reviewOffset, ...content } = stage;
    return {
      ...structuredClone(content),
      id: newId(),
      startDate: addDays(startDate, startOffset),
      endDate: addDays(startDate, endOffset),
      reviewDate: reviewOffset === undefined || reviewOffset === null ? null : addDays(startDate, reviewOffset),
    } as unknown as S;
  });
}

export interface TemplateStageIssue {
  path: (string | number)[];
  message: string;
}

/** The same sense the plan's dates must make (in-force.ts `stageIssues`), in days: ends after starts, no day in two stages. */
export function templateStageIssues(
  stages: readonly Pick<TemplateStage, 'startOffset' | 'endOffset' | 'reviewOffset'>[],
): TemplateStageIssue[] {
  const issues: TemplateStageIssue[] = [];
  stages.forEach((s, i) => {
    if (s.endOffset < s.startOffset) issues.push({ path: [i, 'endOffset'], message: 'must be on or after the first day of the stage' });
  });
  const order = stages.map((s, i) => ({ s, i })).sort((a, b) => a.s.startOffset - b.s.startOffset);
  for (let k = 1; k < order.length; k++) {
    const prev = order[k - 1];
    const cur = order[k];
    if (cur.s.startOffset <= prev.s.endOffset)
      issues.push({
        path: [cur.i, 'startOffset'],
        message: `overlaps stage ${prev.i + 1} (which ends on day ${prev.s.endOffset + 1}); a day can belong to one stage only`,
      });
  }
  return issues;
}

/** How long a template runs, in days, from its first day to the last stage's end (inclusive). */
export function templateLengthDays(stages: readonly Pick<TemplateStage, 'endOffset'>[]): number {
  return stages.length === 0 ? 0 : Math.max(...stages.map((s) => s.endOffset)) + 1;
}
