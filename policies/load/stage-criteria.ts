import { addDays } from '../today';

/**
 * Exit criteria of a restriction-plan stage, and whether they are met.
 *
 * Return to sport moves along a continuum by criteria agreed with the athlete, a shared decision
 * (Bern consensus, Ardern et al. 2016, BJSM 50:853–864). The app never moves a stage on its own: it
 * works out each criterion's state from the evidence and, when all are met, the clinician is asked.
 *
 * Three kinds:
 * - `record`: worked out from the athlete's own record (training logs, pain reports);
 * - `clinician`: a measured test against a threshold, or a yes/no judgement, recorded by the clinician;
 * - `athlete`: the athlete's readiness to move on, 0–10, against a threshold.
 *
 * Only evidence dated from the stage's start up to today counts. Evidence that cannot be read (a
 * morning score never given, a value that is not a number) never counts as a pass.
 */

export const RECORD_RULES = ['pain_settled_sessions', 'no_red_flags', 'sessions_logged', 'rpe_at_most'] as const;
export type RecordRule = (typeof RECORD_RULES)[number];
export const CRITERION_KINDS = ['record', 'clinician', 'athlete'] as const;
export type CriterionKind = (typeof CRITERION_KINDS)[number];
export const CLINICIAN_MEASURES = ['threshold', 'yes_no'] as const;
export const THRESHOLD_DIRECTIONS = ['at_least', 'at_most'] as const;

export interface RecordCriterion {
  id: string;
  kind: 'record';
  rule: RecordRule;
  /** Sessions needed: in a row for pain_settled_sessions and rpe_at_most, in all for sessions_logged. */
  count?: number;
  /** pain_settled_sessions: the highest pain during the session that still counts (0–10). */
  maxPain?: number;
  /** rpe_at_most: the highest session effort that still counts (0–10). */
  maxRpe?: number;
}

export interface ClinicianCriterion {
  id: string;
  kind: 'clinician';
  label: string;
  measure: 'threshold' | 'yes_no';
  threshold?: number;
  direction?: 'at_least' | 'at_most';
  unit?: string | null;
}

export interface AthleteCriterion {
  id: string;
  kind: 'athlete';
  /** Readiness to move on, 0–10: met at this value or above. */
  threshold: number;
}

export type StageCriterion = RecordCriterion | ClinicianCriterion | AthleteCriterion;

export interface LogEvidence {
  date: string;
  painBefore: number;
  painDuring: number;
  painNextMorning: number | null;
  sessionRpe: number;
  /** Logged from a planned session ("at the planned load"). */
  planned: boolean;
}

export interface CriteriaEvidence {
  /** First day of the stage: earlier evidence does not count. */
  stageStart: string;
  today: string;
  /** Training logs, any order. */
  logs: LogEvidence[];
  /** Dates of pain reports with at least one red-flag answer "yes". */
  redFlagDates: string[];
  assessments: { criterionId: string; date: string; value: number | null; met: boolean | null; note?: string | null }[];
  /** The athlete's readiness ratings, 0–10. */
  ratings: { date: string; value: number }[];
}

export type CriterionState = 'met' | 'not_met' | 'waiting';

export interface CriterionResult {
  criterionId: string;
  kind: CriterionKind;
  state: CriterionState;
  /** How far along: e.g. 2 of 3 sessions in a row (need is 1 for a single reading). */
  have: number;
  need: number;
  /** The evidence, for the care team. */
  evidence: string;
  /** The date of the reading or of the last counted session, if any. */
  lastDate: string | null;
}

export interface StageCriteriaResult {
  results: CriterionResult[];
  /** True only when the stage has criteria and every one is met. */
  allMet: boolean;
  metCount: number;
}

const fin = (n: unknown): n is number => typeof n === 'number' && Number.isFinite(n);

/** Logs of the stage, oldest first (stable for the same day). */
function stageLogs(ev: CriteriaEvidence): LogEvidence[] {
  return ev.logs
    .filter((l) => l.date >= ev.stageStart && l.date <= ev.today)
    .map((l, i) => ({ l, i }))
    .sort((a, b) => (a.l.date < b.l.date ? -1 : a.l.date > b.l.date ? 1 : a.i - b.i))
    .map((x) => x.l);
}

/**
 * Consecutive passing sessions counted back from the latest. Latest sessions still waiting for their
 * next-morning answer are skipped (neither pass nor break); any other unreadable one breaks the run.
 */
function streak(logs: LogEvidence[], passes: (l: LogEvidence) => boolean | 'pending'): { run: number; last: string | null } {
  let run = 0;
  let last: string | null = null;
  let skippingPending = true;
  for (let k = logs.length - 1; k >= 0; k--) {
    const p = passes(logs[k]);
    if (p === 'pending' && skippingPending) continue;
    skippingPending = false;
    if (p !== true) break;
    run++;
    last ??= logs[k].date;
  }
  return { run, last };
}

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

function evaluateRecord(c: RecordCriterion, ev: CriteriaEvidence): CriterionResult {
  const logs = stageLogs(ev);
  const base = { criterionId: c.id, kind: 'record' as const };
  switch (c.rule) {
    case 'pain_settled_sessions': {
      const need = fin(c.count) ? c.count : 1;
      const max = fin(c.maxPain) ? c.maxPain : 0;
      const { run, last } = streak(logs, (l) => {
        if (!fin(l.painDuring) || !fin(l.painBefore)) return false;
        if (l.painDuring > max) return false;
        if (l.painNextMorning === null) return 'pending';
        return fin(l.painNextMorning) && l.painNextMorning <= l.painBefore;
      });
      return {
        ...base,
        state: run >= need ? 'met' : logs.length === 0 ? 'waiting' : 'not_met',
        have: Math.min(run, need),
        need,
        evidence: `${plural(run, 'session')} in a row with pain during ≤ ${max} and next morning not above before (of ${plural(logs.length, 'session')} logged in this stage)`,
        lastDate: last,
      };
    }
    case 'rpe_at_most': {
      const need = fin(c.count) ? c.count : 1;
      const max = fin(c.maxRpe) ? c.maxRpe : 0;
      const planned = logs.filter((l) => l.planned);
      const { run, last } = streak(planned, (l) => fin(l.sessionRpe) && l.sessionRpe <= max);
      return {
        ...base,
        state: run >= need ? 'met' : planned.length === 0 ? 'waiting' : 'not_met',
        have: Math.min(run, need),
        need,
        evidence: `${plural(run, 'planned session')} in a row at session RPE ≤ ${max} (of ${planned.length} logged from the plan in this stage)`,
        lastDate: last,
      };
    }
    case 'sessions_logged': {
      const need = fin(c.count) ? c.count : 1;
      return {
        ...base,
        state: logs.length >= need ? 'met' : logs.length === 0 ? 'waiting' : 'not_met',
        have: Math.min(logs.length, need),
        need,
        evidence: `${plural(logs.length, 'session')} logged in this stage`,
        lastDate: logs.length ? logs[logs.length - 1].date : null,
      };
    }
    case 'no_red_flags': {
      const flagged = ev.redFlagDates.filter((d) => d >= ev.stageStart && d <= ev.today).sort();
      const started = ev.stageStart <= ev.today;
      return {
        ...base,
        state: !started ? 'waiting' : flagged.length ? 'not_met' : 'met',
        have: started && !flagged.length ? 1 : 0,
        need: 1,
        evidence: flagged.length
          ? `a warning-sign answer on ${flagged[flagged.length - 1]} (${plural(flagged.length, 'report')} since the stage began)`
          : 'no warning-sign answer since the stage began',
        lastDate: flagged.length ? flagged[flagged.length - 1] : null,
      };
    }
  }
}

function latest<T extends { date: string }>(items: T[], ev: CriteriaEvidence): T | null {
  let best: T | null = null;
  for (const it of items) {
    if (it.date < ev.stageStart || it.date > ev.today) continue;
    if (!best || it.date >= best.date) best = it;
  }
  return best;
}

/** Whether a measured value meets its threshold; a value or threshold that is not a number never does. */
export function meetsThreshold(value: number | null, threshold: number | undefined, direction: 'at_least' | 'at_most' = 'at_least') {
  if (!fin(value) || !fin(threshold)) return false;
  return direction === 'at_most' ? value <= threshold : value >= threshold;
}

function evaluateClinician(c: ClinicianCriterion, ev: CriteriaEvidence): CriterionResult {
  const a = latest(
    ev.assessments.filter((x) => x.criterionId === c.id),
    ev,
  );
  const base = { criterionId: c.id, kind: 'clinician' as const, need: 1, lastDate: a?.date ?? null };
  if (!a) return { ...base, state: 'waiting', have: 0, evidence: 'not assessed in this stage yet' };
  const met = c.measure === 'yes_no' ? a.met === true : meetsThreshold(a.value, c.threshold, c.direction);
  const reading =
    c.measure === 'yes_no'
      ? a.met === true
        ? 'yes'
        : 'no'
      : `${fin(a.value) ? a.value : '—'}${c.unit ? ` ${c.unit}` : ''} (needs ${c.direction === 'at_most' ? '≤' : '≥'} ${c.threshold}${c.unit ? ` ${c.unit}` : ''})`;
  return {
    ...base,
    state: met ? 'met' : 'not_met',
    have: met ? 1 : 0,
    evidence: `assessed ${a.date}: ${reading}${a.note ? ` — ${a.note}` : ''}`,
  };
}

function evaluateAthlete(c: AthleteCriterion, ev: CriteriaEvidence): CriterionResult {
  const r = latest(ev.ratings, ev);
  const base = { criterionId: c.id, kind: 'athlete' as const, need: 1, lastDate: r?.date ?? null };
  if (!r) return { ...base, state: 'waiting', have: 0, evidence: 'no readiness rating in this stage yet' };
  const met = meetsThreshold(r.value, c.threshold);
  return {
    ...base,
    state: met ? 'met' : 'not_met',
    have: met ? 1 : 0,
    evidence: `readiness ${r.value}/10 on ${r.date} (needs ≥ ${c.threshold})`,
  };
}

export function evaluateCriterion(c: StageCriterion, ev: CriteriaEvidence): CriterionResult {
  switch (c.kind) {
    case 'record':
      return evaluateRecord(c, ev);
    case 'clinician':
      return evaluateClinician(c, ev);
    case 'athlete':
      return evaluateAthlete(c, ev);
  }
}

/** Every criterion of a stage, in the stage's order. */
export function evaluateStageCriteria(criteria: readonly StageCriterion[], ev: CriteriaEvidence): StageCriteriaResult {
  const results = criteria.map((c) => evaluateCriterion(c, ev));
  const metCount = results.filter((r) => r.state === 'met').length;
  return { results, allMet: results.length > 0 && metCount === results.length, metCount };
}

export interface StageMoveStage {
  id: string;
  startDate: string;
  endDate: string;
  reviewDate?: string | null;
}

/** Whole days from a to b (b − a). */
export function daysFrom(a: string, b: string): number {
  return Math.round((Date.parse(`${b}T00:00:00Z`) - Date.parse(`${a}T00:00:00Z`)) / 86_400_000);
}

export type StageMove<S> =
  | { ok: true; stages: S[]; toStageId: string; plannedStart: string; daysEarly: number }
  | { ok: false; field: 'fromStageId' | 'effectiveDate'; message: string };

/**
 * Move from one stage to the next on `date`, earlier or later than the dates: the stage being left
 * ends the day before, the next stage starts on `date`, and it and every later stage keep their
 * lengths, shifted by the same number of days. `daysEarly` is positive when earlier than planned,
 * negative when later.
 */
export function moveToNextStage<S extends StageMoveStage>(stages: readonly S[], fromStageId: string, date: string): StageMove<S> {
  const order = [...stages].sort((a, b) => (a.startDate < b.startDate ? -1 : a.startDate > b.startDate ? 1 : 0));
  const k = order.findIndex((s) => s.id === fromStageId);
  if (k < 0) return { ok: false, field: 'fromStageId', message: 'is not a stage of this plan' };
  if (k === order.length - 1) return { ok: false, field: 'fromStageId', message: 'is the last stage: there is no next stage to move to' };
  const from = order[k];
  if (date <= from.startDate) {
    return { ok: false, field: 'effectiveDate', message: `must be after the stage being left starts (${from.startDate})` };
  }
  const next = order[k + 1];
  const shift = daysFrom(next.startDate, date);
  const moved = order.map((s, i): S => {
    if (i === k) return { ...s, endDate: addDays(date, -1), reviewDate: s.reviewDate && s.reviewDate >= date ? null : s.reviewDate };
    if (i > k) {
      return {
        ...s,
        startDate: addDays(s.startDate, shift),
        endDate: addDays(s.endDate, shift),
        reviewDate: s.reviewDate ? addDays(s.reviewDate, shift) : s.reviewDate,
      };
    }
    return s;
  });
  const byId = new Map(moved.map((s) => [s.id, s]));
  return { ok: true, stages: stages.map((s) => byId.get(s.id)!), toStageId: next.id, plannedStart: next.startDate, daysEarly: -shift };
}
