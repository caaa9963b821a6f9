import type { PlanStage } from './in-force';
import { CAP_KEYS, MOVEMENT_PATTERNS, PATTERN_LABELS, type CapKey, type PatternRule } from './patterns';
import { humanDate } from '../words/dates';

export interface PlanSnapshot {
  stages: PlanStage[];
  guidance: string;
}

export interface PlanChange {
  /** Where: 'Plan', or the stage's label / number. */
  where: string;
  what: string;
  before: string | null;
  after: string | null;
}

const CAP_WORDS: Record<CapKey, string> = {
  maxPercent1RM: 'max % of estimated 1RM',
  maxLoadKg: 'max load (kg)',
  maxRpe: 'max RPE',
  maxSetsPerSession: 'max sets per session',
  maxRepsPerSet: 'max reps per set',
  maxHardSetsPerWeek: 'max hard sets per week',
  impactAllowed: 'impact allowed',
};

const show = (v: unknown): string | null =>
  v === undefined || v === null || v === '' ? null : typeof v === 'boolean' ? (v ? 'yes' : 'no') : String(v);

function stageName(stage: PlanStage, index: number) {
  return stage.label ? `Stage ${index + 1} (${stage.label})` : `Stage ${index + 1}`;
}

function ruleOf(stage: PlanStage, pattern: (typeof MOVEMENT_PATTERNS)[number]): PatternRule {
  return stage.patterns[pattern] ?? { mode: 'free' };
}

/**
 * What changed between two versions of a plan, in words a reviewer can scan: stages matched by
 * their id (so reordering is not a change of content), then dates, pain ceiling, modes and caps.
 */
export function diffPlans(before: PlanSnapshot, after: PlanSnapshot): PlanChange[] {
  const changes: PlanChange[] = [];
  if (before.guidance !== after.guidance)
    changes.push({ where: 'Plan', what: 'guidance', before: show(before.guidance), after: show(after.guidance) });
  const oldById = new Map(before.stages.map((s, i) => [s.id, { s, i }]));
  const newIds = new Set(after.stages.map((s) => s.id));
  before.stages.forEach((s, i) => {
    if (!newIds.has(s.id))
      changes.push({
        where: stageName(s, i),
        what: 'stage removed',
        before: `${humanDate(s.startDate)} – ${humanDate(s.endDate)}`,
        after: null,
      });
  });
  after.stages.forEach((s, i) => {
    const old = oldById.get(s.id);
    const where = stageName(s, i);
    if (!old) {
      changes.push({ where, what: 'stage added', before: null, after: `${humanDate(s.startDate)} – ${humanDate(s.endDate)}` });
      return;
    }
    if (old.i !== i) changes.push({ where, what: 'position', before: String(old.i + 1), after: String(i + 1) });
    for (const key of ['label', 'startDate', 'endDate', 'reviewDate', 'painCeiling'] as const) {
      if (show(old.s[key]) !== show(s[key]))
        changes.push({
          where,
          what: key === 'painCeiling' ? 'pain ceiling' : key.replace(/[A-Z]/g, (c) => ` ${c.toLowerCase()}`),
          before: show(old.s[key]),
          after: show(s[key]),
        });
    }
    for (const p of MOVEMENT_PATTERNS) {
      const a = ruleOf(old.s, p);
      const b = ruleOf(s, p);
      if (a.mode !== b.mode) changes.push({ where, what: `${PATTERN_LABELS[p]}: mode`, before: a.mode, after: b.mode });
      for (const k of CAP_KEYS) {
        if (show(a.caps?.[k]) !== show(b.caps?.[k])) {
          changes.push({ where, what: `${PATTERN_LABELS[p]}: ${CAP_WORDS[k]}`, before: show(a.caps?.[k]), after: show(b.caps?.[k]) });
        }
      }
    }
  });
  return changes;
}
