import type { Unit } from '../schemas/common';
import { loadTimesReps } from '../words/loads';
import { n } from './check-support';
import { isFiniteNumber } from './guard';
import { platesPerSide } from './plates';
import type { FitState } from './team-fit-types';
import { formatLoad, toUnit } from './units';

/**
 * The floor sheet of team programming: one row per athlete of a group for one team session, with each
 * athlete's own loads in their own unit and, for barbell sets, the plates to put on each side — the
 * page a coach tapes to the rack. Pure formatting, shared by the PDF and the CSV (both built on the
 * server from the same rows, so they cannot disagree).
 *
 * Plates follow policies/load/plates.ts: kg plates on a 20 kg bar, lb plates on a 45 lb bar, no
 * collars counted, the closest load under the plan when the plates cannot make it exactly.
 */

/** One planned set as the sheet reads it: its load already resolved to kg (null: body weight, or a % with no 1RM). */
export interface FloorSetInput {
  reps: number;
  loadKg: number | null;
  /** The % of 1RM as written, when the load is a % (kept for a % the athlete has no 1RM for). */
  percent: number | null;
  targetRpe?: number | null;
  warmUp?: boolean;
}

export interface FloorExerciseInput {
  name: string;
  barbell: boolean;
  sets: FloorSetInput[];
  /** The fitting changed this exercise row (a lower load, fewer reps or sets, a swap). */
  changed: boolean;
  /** The exercise as written, when this row is a swap for it. */
  insteadOf?: string | null;
}

export interface FloorAthleteInput {
  athleteName: string;
  unit: Unit;
  /** The athlete's version of the team session; null when none was fitted yet. */
  state: FitState | null;
  exercises: FloorExerciseInput[];
  /** Sets or exercises the fitting dropped: "Sprint 20 m: Sprint not allowed on this date". */
  dropped: string[];
  /** Published and now on hold after a limit change: nothing on the row may be trained. */
  held: boolean;
  /** Edited by hand, or a re-fit is waiting for the coach. */
  needsReview: boolean;
  /** The coach accepted the current fit: an accepted drop is no longer a decision to make. */
  reviewed?: boolean;
}

export interface FloorLine {
  exercise: string;
  /** "3 sets of 75 kg × 5 at RPE 7" */
  sets: string;
  /** "75 kg: 25 + 2.5 kg a side"; empty for sets off the barbell. */
  plates: string;
  marked: boolean;
}

export interface FloorRow {
  athleteName: string;
  unit: Unit;
  state: FitState | null;
  stateWords: string;
  /** Fitted rows carry the sheet's mark (the legend says what it means). */
  marked: boolean;
  lines: FloorLine[];
  note: string;
}

export interface FloorSheet {
  organizationName: string;
  groupName: string;
  programName: string;
  sessionTitle: string;
  date: string;
  published: boolean;
  rows: FloorRow[];
}

/** Our own words for the mark and the cautions printed on every page. */
export const FLOOR_MARK_LEGEND =
  "Marked rows were fitted: their loads, reps or exercises differ from the team's session to stay inside the athlete's limits.";
export const FLOOR_CAUTION =
  "Loads come from each athlete's limits as recorded by their licensed clinician; Loadline does not replace their care. Stop the set and tell the coach and the clinician if pain rises or something feels wrong.";

export const STATE_WORDS: Record<FitState, string> = {
  as_written: 'As written',
  fitted: 'Fitted',
  needs_decision: 'Needs a decision',
  out: 'Out',
};

const EPS = 1e-6;

/**
 * What goes on each side of the bar for one load, in the athlete's unit: "25 + 2.5 kg a side",
 * "empty bar", "lighter than the 20 kg bar", or the closest load the plates make under the plan.
 */
export function plateWords(loadKg: number, unit: Unit): string {
  const target = toUnit(loadKg, unit);
  const loading = isFiniteNumber(target) ? platesPerSide(target, unit) : null;
  if (!loading) return 'plates: check the planned load';
  if (target < loading.bar - EPS) return `lighter than the ${n(loading.bar)} ${unit} bar`;
  if (loading.perSide.length === 0 && loading.shortBy === 0) return `empty ${n(loading.bar)} ${unit} bar`;
  const side = loading.perSide.length ? `${loading.perSide.map(n).join(' + ')} ${unit} a side` : `empty ${n(loading.bar)} ${unit} bar`;
  return loading.shortBy > 0 ? `${side} (makes ${n(loading.total)} ${unit})` : side;
}

function oneSetWords(s: FloorSetInput, unit: Unit): string {
  const base =
    s.loadKg === null && s.percent !== null
      ? `${n(s.percent)} % of 1RM × ${s.reps} (no 1RM on record: set the load with the coach)`
      : loadTimesReps(s.loadKg, unit, s.reps);
  const rpe = s.targetRpe != null ? ` at RPE ${n(s.targetRpe)}` : '';
  return `${base}${rpe}${s.warmUp ? ' (warm-up)' : ''}`;
}

/** A row's sets, alike neighbours counted together: "3 sets of 75 kg × 5 at RPE 7, 60 kg × 8". */
export function setsWords(sets: FloorSetInput[], unit: Unit): string {
  const groups: { words: string; count: number }[] = [];
  for (const s of sets) {
    const words = oneSetWords(s, unit);
    const last = groups.at(-1);
    if (last && last.words === words) last.count++;
    else groups.push({ words, count: 1 });
  }
  return groups.map((g) => (g.count > 1 ? `${g.count} sets of ${g.words}` : g.words)).join(', ');
}

/** The plates of each distinct loaded set of a barbell row, once per load, heaviest last as planned. */
export function linePlates(sets: FloorSetInput[], unit: Unit): string {
  const seen = new Set<string>();
  const out: string[] = [];
  for (const s of sets) {
    if (s.loadKg === null || s.loadKg === 0) continue;
    const key = s.loadKg.toFixed(4);
    if (seen.has(key)) continue;
    seen.add(key);
    out.push(`${formatLoad(s.loadKg, unit)}: ${plateWords(s.loadKg, unit)}`);
  }
  return out.join('; ');
}

/** One athlete's row of the sheet. */
export function floorRow(a: FloorAthleteInput): FloorRow {
  const notes: string[] = [];
  let lines: FloorLine[] = [];
  if (a.state === null) notes.push('Not fitted yet: ask the coach.');
  else if (a.state === 'out') notes.push('Out on this date: nothing planned.');
  if (a.held) notes.push('On hold: the limits changed after this was published. Do not train from this row until the coach updates it.');
  else
    lines = a.exercises.map((e) => ({
      exercise: e.insteadOf ? `${e.name} (instead of ${e.insteadOf})` : e.name,
      sets: setsWords(e.sets, a.unit),
      plates: e.barbell ? linePlates(e.sets, a.unit) : '',
      marked: e.changed,
    }));
  if (a.dropped.length) notes.push(`Dropped: ${a.dropped.join('; ')}.`);
  if (a.needsReview && !a.held) notes.push('Waiting for the coach’s review.');
  // Any row the fitting changed is marked: lowered, cut or swapped (fitted), and dropped (needs a decision).
  const marked = a.state === 'fitted' || a.state === 'needs_decision';
  return {
    athleteName: a.athleteName,
    unit: a.unit,
    state: a.state,
    stateWords: !a.state
      ? 'Not fitted'
      : a.state === 'needs_decision' && a.reviewed && !a.needsReview
        ? 'Fitted, part left out'
        : STATE_WORDS[a.state],
    marked,
    lines,
    note: notes.join(' '),
  };
}

/** The CSV's records: one per athlete and exercise (one with empty exercise columns for a row with none). */
export const FLOOR_CSV_COLUMNS = ['athlete', 'state', 'fitted', 'unit', 'exercise', 'sets', 'plates_per_side', 'note'] as const;

export function floorCsvRecords(sheet: FloorSheet): string[][] {
  return sheet.rows.flatMap((r) => {
    const head = [r.athleteName, r.stateWords, r.marked ? 'yes' : '', r.unit];
    if (r.lines.length === 0) return [[...head, '', '', '', r.note]];
    return r.lines.map((l, i) => [...head, l.exercise, l.sets, l.plates, i === 0 ? r.note : '']);
  });
}

/** "floor-sheet-2026-12-07-squad-lift": a file name of plain ASCII letters, digits and dashes. */
export function floorSheetFileName(sheet: Pick<FloorSheet, 'date' | 'sessionTitle'>, ext: 'pdf' | 'csv'): string {
  const slug = sheet.sessionTitle
    .normalize('NFKD')
    .replace(/[^\w\s-]/g, '')
    .replace(/[_\s]+/g, '-')
    .replace(/-+/g, '-')
    .replace(/^-|-$/g, '')
    .toLowerCase()
    .slice(0, 40);
  const day = /^\d{4}-\d{2}-\d{2}$/.test(sheet.date) ? sheet.date : 'session';
  return `floor-sheet-${day}${slug ? `-${slug}` : ''}.${ext}`;
}
