import type { ExerciseDto, ProgramSessionDto } from '../../../../../policies/dto';
import {
  checkSets,
  plannedKg,
  weekOf,
  type Breach,
  type EngineContext,
  type EngineExercise,
  type PlannedLoad,
} from '../../../../../policies/load/compliance';
import { sessionEngineSets, setFingerprintText } from '../../../../../policies/load/sets';
import { inForceOn, ruleForPatterns, type PlanInput } from '../../../../../policies/load/in-force';
import type { ParticipationStatus } from '../../../../../policies/load/patterns';
import { statusOnDate, type StatusChangeInput } from '../../../../../policies/load/status-on';
import type { Unit } from '../../../../../policies/schemas';
import type { SessionContent } from '../../../../../policies/schemas/programs';

/** One athlete's side of the compliance check, as the server assembles it. */
export interface AthleteEngine {
  athleteId: string;
  athleteName: string;
  plans: PlanInput[];
  /** Current 1RM in kg per exercise id. */
  oneRms: Record<string, number>;
  /** Today's participation status. */
  status: ParticipationStatus;
  /** The status decisions of the open cases; each set is checked against the status of its date. */
  statusChanges?: StatusChangeInput[];
  /** Every published session the athlete has, in any program. */
  published: ProgramSessionDto[];
}

export function toEngineExercise(e: ExerciseDto): EngineExercise {
  return {
    id: e.id,
    name: e.name,
    patterns: e.patterns,
    ballistic: e.ballistic,
    steps: e.steps,
    referenceId: e.referenceId,
    useInstead: e.useInstead,
  };
}

export function engineLibrary(library: ExerciseDto[]): Record<string, EngineExercise> {
  return Object.fromEntries(library.map((e) => [e.id, toEngineExercise(e)]));
}

/**
 * What a granted exception is tied to, per set id: the set as granted (policies' setFingerprintText,
 * which the server hashes), so an edit since the grant is checked afresh.
 */
export function fingerprints(session: { date: string; content: SessionContent }): Map<string, string> {
  const out = new Map<string, string>();
  for (const ex of session.content.exercises) for (const s of ex.sets) out.set(s.id, setFingerprintText(ex.exerciseId, s, session.date));
  return out;
}

export interface LiveCheckInput {
  /** The session as edited right now. */
  session: { id: string; date: string; content: SessionContent };
  engine: AthleteEngine;
  exercises: Record<string, EngineExercise>;
  unit: Unit;
  /** Set ids a granted exception covers (already narrowed to sets unchanged since the grant). */
  waived?: ReadonlySet<string>;
}

/**
 * The server's check, run in the browser on the session being typed: each set on its date against
 * the plans in force, with the athlete's other published sessions of the same week counted toward
 * the weekly hard-set limit. Only this session's breaches are returned.
 */
export function liveBreaches({ session, engine, exercises, unit, waived }: LiveCheckInput): Breach[] {
  const week = weekOf(session.date);
  const others = engine.published.filter((s) => s.id !== session.id && weekOf(s.date) === week);
  const ctx: EngineContext = {
    plans: engine.plans,
    exercises,
    baselines: engine.oneRms,
    statusOn: engine.statusChanges ? statusOnDate(engine.statusChanges) : () => engine.status,
    waivedSetIds: waived,
    unit,
  };
  const sets = [...sessionEngineSets(session), ...others.flatMap(sessionEngineSets)];
  return checkSets(sets, ctx).filter((b) => b.sessionId === session.id);
}

export interface LoadLine {
  plannedKg: number;
  capKg: number;
}

/**
 * The load cap that applies to a set on its date (the lower of the %-of-1RM line and the absolute
 * line, across the exercise's patterns) and the planned load in kg, for drawing the line. Null when
 * the set has no load cap or no load in kg can be worked out.
 */
export function loadLine(engine: AthleteEngine, exercise: EngineExercise, date: string, load: PlannedLoad): LoadLine | null {
  const rule = ruleForPatterns(inForceOn(engine.plans, date), exercise.patterns);
  if (rule.mode !== 'capped' || !rule.caps) return null;
  const oneRm = engine.oneRms[exercise.referenceId ?? exercise.id];
  const lines: number[] = [];
  if (rule.caps.maxPercent1RM !== undefined && oneRm !== undefined) lines.push((rule.caps.maxPercent1RM / 100) * oneRm);
  if (rule.caps.maxLoadKg !== undefined) lines.push(rule.caps.maxLoadKg);
  const planned = plannedKg(load, oneRm);
  if (lines.length === 0 || planned === null) return null;
  return { plannedKg: planned, capKg: Math.min(...lines) };
}
