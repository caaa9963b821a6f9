import { isFiniteNumber } from './guard';
import { DEFAULT_PAIN_CEILING, MOVEMENT_PATTERNS, type Caps, type MovementPattern, type PatternRule } from './patterns';
import { humanDate } from '../words/dates';
import type { StageCriterion } from './stage-criteria';

/** One stage of a restriction plan. Dates are 'YYYY-MM-DD'; both ends are inclusive. */
export interface PlanStage {
  id: string;
  label?: string | null;
  startDate: string;
  endDate: string;
  reviewDate?: string | null;
  painCeiling: number;
  /** A pattern left out is free. */
  patterns: Partial<Record<MovementPattern, PatternRule>>;
  /** Exit criteria (stage-criteria.ts); they never change what is in force. */
  criteria?: StageCriterion[];
}

export interface PlanInput {
  planId: string;
  caseId: string;
  version: number;
  stages: PlanStage[];
}

export interface StageIssue {
  path: (string | number)[];
  message: string;
}

/**
 * Stage dates must make sense on their own and must not overlap: on any day at most one stage of a
 * plan is in force. ISO dates compare correctly as strings.
 */
export function stageIssues(stages: Pick<PlanStage, 'startDate' | 'endDate' | 'reviewDate'>[]): StageIssue[] {
  const issues: StageIssue[] = [];
  stages.forEach((s, i) => {
    if (s.endDate < s.startDate) issues.push({ path: [i, 'endDate'], message: 'must be on or after the start date' });
  });
  const order = stages
    .map((s, i) => ({ s, i }))
    .sort((a, b) => (a.s.startDate < b.s.startDate ? -1 : a.s.startDate > b.s.startDate ? 1 : 0));
  for (let k = 1; k < order.length; k++) {
    const prev = order[k - 1];
    const cur = order[k];
    if (cur.s.startDate <= prev.s.endDate) {
      issues.push({
        path: [cur.i, 'startDate'],
        message: `overlaps stage ${prev.i + 1} (which ends ${humanDate(prev.s.endDate)}); a day can belong to one stage only`,
      });
    }
  }
  return issues;
}

/** The stage in force on `date`, or null in a gap or outside the plan. */
export function stageOn<S extends Pick<PlanStage, 'startDate' | 'endDate'>>(stages: S[], date: string): S | null {
  return stages.find((s) => s.startDate <= date && date <= s.endDate) ?? null;
}

const MIN_CAPS = ['maxPercent1RM', 'maxLoadKg', 'maxRpe', 'maxSetsPerSession', 'maxRepsPerSet', 'maxHardSetsPerWeek'] as const;

/**
 * A cap that is not a finite number of 0 or more (stored data gone wrong) is read as 0, so that
 * nothing passes it: compared with NaN every planned value would otherwise pass.
 */
function readCap(v: unknown): number {
  return isFiniteNumber(v) && v >= 0 ? v : 0;
}

/** A pain ceiling is on the 0–10 scale (Silbernagel et al. 2007); one that cannot be read is 0, the strictest. */
export function readPainCeiling(v: unknown): number {
  return isFiniteNumber(v) ? Math.min(10, Math.max(0, v)) : 0;
}

/**
 * The most restrictive of several rules (StARRT: the most restrictive outcome decides — Shrier 2015,
 * BJSM 49:1311–1315): blocked beats capped beats free; among caps, the lowest number of each kind
 * wins, and impact is allowed only if every rule allows it.
 */
export function mergeRules(rules: (PatternRule | undefined)[]): PatternRule {
  const present = rules.filter((r): r is PatternRule => r !== undefined);
  if (present.some((r) => r.mode === 'blocked')) return { mode: 'blocked' };
  const capped = present.filter((r) => r.mode === 'capped');
  if (capped.length === 0) return { mode: 'free' };
  const caps: Caps = {};
  for (const key of MIN_CAPS) {
    const values = capped
      .map((r) => r.caps?.[key])
      .filter((v) => v !== undefined && v !== null)
      .map(readCap);
    if (values.length) caps[key] = Math.min(...values);
  }
  const impacts = capped.map((r) => r.caps?.impactAllowed).filter((v): v is boolean => typeof v === 'boolean');
  if (impacts.length) caps.impactAllowed = impacts.every(Boolean);
  return { mode: 'capped', caps };
}

export interface StageInForce {
  planId: string;
  caseId: string;
  planVersion: number;
  stage: PlanStage;
}

export interface InForce {
  date: string;
  /** The stage of each plan that covers the date (several open cases can each have a plan). */
  stages: StageInForce[];
  patterns: Record<MovementPattern, PatternRule>;
  painCeiling: number;
  /** Whether any restriction applies at all on this date. */
  restricted: boolean;
}

/** What is in force for an athlete on `date`, across all their active plans. */
export function inForceOn(plans: PlanInput[], date: string): InForce {
  const stages: StageInForce[] = [];
  for (const plan of plans) {
    const stage = stageOn(plan.stages, date);
    if (stage) stages.push({ planId: plan.planId, caseId: plan.caseId, planVersion: plan.version, stage });
  }
  const patterns = {} as Record<MovementPattern, PatternRule>;
  for (const p of MOVEMENT_PATTERNS) patterns[p] = mergeRules(stages.map((s) => s.stage.patterns[p]));
  const painCeiling = stages.length ? Math.min(...stages.map((s) => readPainCeiling(s.stage.painCeiling))) : DEFAULT_PAIN_CEILING;
  const restricted = MOVEMENT_PATTERNS.some((p) => patterns[p].mode !== 'free');
  return { date, stages, patterns, painCeiling, restricted };
}

/** The rule for an exercise that trains several patterns: the most restrictive of them. */
export function ruleForPatterns(inForce: Pick<InForce, 'patterns'>, patterns: MovementPattern[]): PatternRule {
  return mergeRules(patterns.map((p) => inForce.patterns[p]));
}
