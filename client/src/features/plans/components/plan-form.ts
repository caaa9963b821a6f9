import type { FieldErrors, Resolver } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { PlanCreateSchema, type PlanCreateInput, type Unit } from '../../../../../policies/schemas';
import { stageIssues, type PlanStage } from '../../../../../policies/load/in-force';
import {
  DEFAULT_PAIN_CEILING,
  MOVEMENT_PATTERNS,
  type Caps,
  type MovementPattern,
  type PatternMode,
  type PatternRule,
} from '../../../../../policies/load/patterns';
import { fromUnit, toUnit } from '../../../../../policies/load/units';
import type { CriterionKind, RecordRule, StageCriterion } from '../../../../../policies/load/stage-criteria';
import { addDaysIso, todayLocal } from '../../../lib/dates';

/**
 * The plan editor's own shape: what the inputs hold (text, the load in the person's unit, every
 * pattern present). `toPayload` turns it into the API's shape, which the shared schema then checks.
 */
export const NUMBER_CAPS = ['maxPercent1RM', 'maxLoad', 'maxRpe', 'maxSetsPerSession', 'maxRepsPerSet', 'maxHardSetsPerWeek'] as const;
export type NumberCapField = (typeof NUMBER_CAPS)[number];

export type CapsForm = Record<NumberCapField, string> & { impactAllowed: '' | 'yes' | 'no' };

export interface RuleForm {
  mode: PatternMode;
  caps: CapsForm;
  /** The stored kg and how it was first shown: an untouched load goes back exactly as it came. */
  loadFrom: { shown: string; kg: number } | null;
}

export interface StageForm {
  stageId: string;
  label: string;
  startDate: string;
  endDate: string;
  reviewDate: string;
  painCeiling: string;
  patterns: Record<MovementPattern, RuleForm>;
  /** Exit criteria as the editor holds them (text in the inputs); `toPayload` turns them back exactly. */
  criteria: CriterionForm[];
}

/**
 * One exit criterion as the inputs hold it: every kind's fields are present, so switching a record
 * rule keeps what was typed; only the fields of the criterion's kind (and rule) are sent.
 */
export interface CriterionForm {
  id: string;
  kind: CriterionKind;
  rule: RecordRule;
  count: string;
  maxPain: string;
  maxRpe: string;
  label: string;
  measure: 'threshold' | 'yes_no';
  threshold: string;
  direction: 'at_least' | 'at_most';
  unit: string;
}

const numText = (v: number | undefined | null) => (v === undefined || v === null ? '' : String(v));

export function criterionToForm(c: StageCriterion): CriterionForm {
  const base = blankCriterion(c.kind, c.id);
  switch (c.kind) {
    case 'record':
      return { ...base, rule: c.rule, count: numText(c.count), maxPain: numText(c.maxPain), maxRpe: numText(c.maxRpe) };
    case 'clinician':
      return {
        ...base,
        label: c.label,
        measure: c.measure,
        threshold: numText(c.threshold),
        direction: c.direction ?? 'at_least',
        unit: c.unit ?? '',
      };
    case 'athlete':
      return { ...base, threshold: numText(c.threshold) };
  }
}

/**
 * A new criterion of one kind. The record rule starts at our worked example (pain during ≤ 2,
 * three sessions in a row); thresholds start empty, so the clinician sets each one.
 */
export function blankCriterion(kind: CriterionKind, id: string = crypto.randomUUID()): CriterionForm {
  return {
    id,
    kind,
    rule: 'pain_settled_sessions',
    count: kind === 'record' ? '3' : '',
    maxPain: kind === 'record' ? '2' : '',
    maxRpe: '',
    label: '',
    measure: 'threshold',
    threshold: '',
    direction: 'at_least',
    unit: '',
  };
}

/** The API's shape of one criterion: only its kind's fields; '' is "not given", so the schema names it. */
export function criterionToPayload(f: CriterionForm): StageCriterion {
  switch (f.kind) {
    case 'record': {
      const out: StageCriterion = { id: f.id, kind: 'record', rule: f.rule };
      if (f.rule !== 'no_red_flags') out.count = numberOrUndefined(f.count);
      if (f.rule === 'pain_settled_sessions') out.maxPain = numberOrUndefined(f.maxPain);
      if (f.rule === 'rpe_at_most') out.maxRpe = numberOrUndefined(f.maxRpe);
      for (const key of ['count', 'maxPain', 'maxRpe'] as const) if (out[key] === undefined) delete out[key];
      return out;
    }
    case 'clinician': {
      const out: StageCriterion = { id: f.id, kind: 'clinician', label: f.label.trim(), measure: f.measure };
      if (f.measure === 'threshold') {
        const threshold = numberOrUndefined(f.threshold);
        if (threshold !== undefined) out.threshold = threshold;
        out.direction = f.direction;
        if (f.unit.trim() !== '') out.unit = f.unit.trim();
      }
      return out;
    }
    case 'athlete':
      return { id: f.id, kind: 'athlete', threshold: numberOrUndefined(f.threshold) as number };
  }
}

export interface PlanForm {
  stages: StageForm[];
  guidance: string;
  changeNote: string;
}

const EMPTY_CAPS: CapsForm = {
  maxPercent1RM: '',
  maxLoad: '',
  maxRpe: '',
  maxSetsPerSession: '',
  maxRepsPerSet: '',
  maxHardSetsPerWeek: '',
  impactAllowed: '',
};

/** A load for the input: the person's unit, at most two decimals. */
export function loadForInput(kg: number, unit: Unit): string {
  return String(Number(toUnit(kg, unit).toFixed(2)));
}

function ruleToForm(rule: PatternRule | undefined, unit: Unit): RuleForm {
  const caps = rule?.caps ?? {};
  const text = (v: number | undefined) => (v === undefined ? '' : String(v));
  const shown = caps.maxLoadKg === undefined ? '' : loadForInput(caps.maxLoadKg, unit);
  return {
    mode: rule?.mode ?? 'free',
    caps: {
      maxPercent1RM: text(caps.maxPercent1RM),
      maxLoad: shown,
      maxRpe: text(caps.maxRpe),
      maxSetsPerSession: text(caps.maxSetsPerSession),
      maxRepsPerSet: text(caps.maxRepsPerSet),
      maxHardSetsPerWeek: text(caps.maxHardSetsPerWeek),
      impactAllowed: caps.impactAllowed === undefined ? '' : caps.impactAllowed ? 'yes' : 'no',
    },
    loadFrom: caps.maxLoadKg === undefined ? null : { shown, kg: caps.maxLoadKg },
  };
}

export function freePatterns(): Record<MovementPattern, RuleForm> {
  return Object.fromEntries(
    MOVEMENT_PATTERNS.map((p) => [p, { mode: 'free', caps: { ...EMPTY_CAPS }, loadFrom: null } satisfies RuleForm]),
  ) as Record<MovementPattern, RuleForm>;
}

export function stageToForm(stage: PlanStage, unit: Unit, stageId: string = stage.id): StageForm {
  return {
    stageId,
    label: stage.label ?? '',
    startDate: stage.startDate,
    endDate: stage.endDate,
    reviewDate: stage.reviewDate ?? '',
    painCeiling: String(stage.painCeiling),
    patterns: Object.fromEntries(MOVEMENT_PATTERNS.map((p) => [p, ruleToForm(stage.patterns[p], unit)])) as Record<
      MovementPattern,
      RuleForm
    >,
    criteria: (stage.criteria ?? []).map(criterionToForm),
  };
}

/** Stages copied from another plan are new stages here: same content, fresh ids. */
export function copiedStages(stages: PlanStage[], unit: Unit): StageForm[] {
  return stages.map((s) => stageToForm(s, unit, crypto.randomUUID()));
}

const DEFAULT_STAGE_DAYS = 14;

/** A blank stage starts the day after the last one ends (or today) and runs two weeks. */
export function blankStage(previous?: Pick<StageForm, 'endDate'>): StageForm {
  const validEnd = previous && /^\d{4}-\d{2}-\d{2}$/.test(previous.endDate) ? previous.endDate : null;
  const startDate = validEnd ? addDaysIso(validEnd, 1) : todayLocal();
  return {
    stageId: crypto.randomUUID(),
    label: '',
    startDate,
    endDate: addDaysIso(startDate, DEFAULT_STAGE_DAYS - 1),
    reviewDate: '',
    painCeiling: String(DEFAULT_PAIN_CEILING),
    patterns: freePatterns(),
    criteria: [],
  };
}

export function planToForm(stages: PlanStage[], guidance: string, unit: Unit): PlanForm {
  return { stages: stages.map((s) => stageToForm(s, unit)), guidance, changeNote: '' };
}

/** '' is "not set"; anything else goes to the schema as a number, so "abc" is refused in words. */
function numberOrUndefined(text: string): number | undefined {
  const t = text.trim();
  return t === '' ? undefined : Number(t);
}

function ruleToPayload(rule: RuleForm, unit: Unit): PatternRule {
  if (rule.mode !== 'capped') return { mode: rule.mode };
  const c = rule.caps;
  const load = c.maxLoad.trim();
  const caps: Caps = {
    maxPercent1RM: numberOrUndefined(c.maxPercent1RM),
    maxLoadKg: load === '' ? undefined : rule.loadFrom && load === rule.loadFrom.shown ? rule.loadFrom.kg : fromUnit(Number(load), unit),
    maxRpe: numberOrUndefined(c.maxRpe),
    maxSetsPerSession: numberOrUndefined(c.maxSetsPerSession),
    maxRepsPerSet: numberOrUndefined(c.maxRepsPerSet),
    maxHardSetsPerWeek: numberOrUndefined(c.maxHardSetsPerWeek),
    impactAllowed: c.impactAllowed === '' ? undefined : c.impactAllowed === 'yes',
  };
  for (const key of Object.keys(caps) as (keyof Caps)[]) if (caps[key] === undefined) delete caps[key];
  return { mode: 'capped', caps };
}

/** The API's shape. A free pattern is left out, which the server reads as free. */
export function toPayload(form: PlanForm, unit: Unit): PlanCreateInput {
  return {
    stages: form.stages.map((s) => ({
      id: s.stageId,
      label: s.label.trim() === '' ? null : s.label.trim(),
      startDate: s.startDate,
      endDate: s.endDate,
      reviewDate: s.reviewDate === '' ? null : s.reviewDate,
      painCeiling: s.painCeiling.trim() === '' ? DEFAULT_PAIN_CEILING : Number(s.painCeiling),
      patterns: Object.fromEntries(
        MOVEMENT_PATTERNS.filter((p) => s.patterns[p].mode !== 'free').map((p) => [p, ruleToPayload(s.patterns[p], unit)]),
      ),
      ...(s.criteria.length ? { criteria: s.criteria.map(criterionToPayload) } : {}),
    })),
    guidance: form.guidance,
    changeNote: form.changeNote.trim() === '' ? undefined : form.changeNote.trim(),
  };
}

const ISO = /^\d{4}-\d{2}-\d{2}$/;

/**
 * Date problems between stages (an end before its start, two stages on one day), from the shared
 * rule. Stages whose dates are not filled in yet are left to the schema's own messages.
 */
export function liveStageIssues(stages: Pick<StageForm, 'startDate' | 'endDate'>[]) {
  const dated = stages.map((s, i) => ({ s, i })).filter(({ s }) => ISO.test(s.startDate) && ISO.test(s.endDate));
  return stageIssues(dated.map(({ s }) => s)).map((issue) => {
    const [k, field] = issue.path as [number, string];
    return {
      stage: dated[k].i,
      field: field as 'startDate' | 'endDate',
      message: renumber(
        issue.message,
        dated.map((d) => d.i),
      ),
    };
  });
}

/** The shared rule numbers stages among those it was given; say the number the clinician sees. */
function renumber(message: string, indexes: number[]): string {
  return message.replace(/stage (\d+)/, (_m, n: string) => `stage ${(indexes[Number(n) - 1] ?? Number(n) - 1) + 1}`);
}

type ErrorTree = Record<string, unknown>;

/** Moves errors from the API's names to the form's (maxLoadKg → maxLoad, id → stageId). */
function toFormErrors(errors: FieldErrors): FieldErrors<PlanForm> {
  const stages = (errors as ErrorTree).stages as ErrorTree | undefined;
  if (stages && typeof stages === 'object') {
    for (const [key, stage] of Object.entries(stages)) {
      if (!/^\d+$/.test(key) || !stage || typeof stage !== 'object') continue;
      const s = stage as ErrorTree;
      if (s.id) {
        s.stageId = s.id;
        delete s.id;
      }
      const patterns = s.patterns as Record<string, ErrorTree | undefined> | undefined;
      for (const rule of Object.values(patterns ?? {})) {
        const caps = rule?.caps as ErrorTree | undefined;
        if (caps?.maxLoadKg) {
          caps.maxLoad = caps.maxLoadKg;
          delete caps.maxLoadKg;
        }
      }
    }
  }
  return errors as FieldErrors<PlanForm>;
}

/**
 * The same schema the server applies (PlanCreateSchema), run on exactly what would be sent. The
 * stage-date rule is added even when other fields fail, so overlaps are always named before saving.
 */
export function planFormResolver(unit: Unit): Resolver<PlanForm, unknown, PlanCreateInput> {
  const schemaResolver = zodResolver(PlanCreateSchema);
  return async (values, context, options) => {
    const payload = toPayload(values, unit);
    const result = await schemaResolver(payload as never, context, options as never);
    const errors = toFormErrors(result.errors as FieldErrors);
    const tree = errors as ErrorTree;
    for (const issue of liveStageIssues(values.stages)) {
      const stages = (tree.stages ??= []) as ErrorTree;
      const stage = (stages[issue.stage] ??= {}) as ErrorTree;
      stage[issue.field] ??= { type: 'custom', message: issue.message };
    }
    if (Object.keys(errors).length > 0) return { values: {}, errors };
    return { values: result.values as PlanCreateInput, errors: {} };
  };
}
