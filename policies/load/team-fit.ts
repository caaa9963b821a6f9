import type { SessionContent } from '../schemas/programs';
import type { Breach } from './breach';
import { checkSetsToFit, type EngineContext } from './compliance';
import { inForceOn, type InForce } from './in-force';
import { PreparedRules, type StageRules } from './prepared-rules';
import { plannedKg, type EngineSet } from './sets';
import { finish } from './team-fit-changes';
import { otherSetsOf, swapCandidates, weeklyLimit, type SessionOf } from './team-fit-day';
import { COUNT_RULES, drop, fixSet, noteOf } from './team-fit-fix';
import type { FittedSession } from './team-fit-types';
import { allReadable, asWrittenContent, counts, engineSetsOf, loadsFor, newRow, type ResolvedLoads, type Row } from './team-fit-rows';
import { oneRmFor } from './team-fit-support';

/**
 * One athlete's version of a team session (team programming). The team session is resolved
 * against the athlete's baselines (% of 1RM → a load on the exercise's steps; not a change) and then
 * checked by the compliance engine on its date, with the athlete's other published sets of the same
 * weeks counted toward weekly limits. Each set the engine blocks is fitted, in this order:
 *   (a) the largest load that fits, never rounded up (the engine's own fit, suggestFit);
 *   (b) fewer reps where reps are capped (a rep cap, or an RPE cap no load fits at the planned reps),
 *       fewer sets where sets are capped (per session, hard sets per week — the sets the engine
 *       counts beyond the cap are cut);
 *   (c) a swap of the exercise row: first the exercise's "use instead" list in order (which may name an
 *       exercise with no pattern, allowed everywhere: a non-impact conditioning piece for a blocked
 *       sprint), then library exercises sharing a movement pattern that are allowed on the date. An
 *       exercise with no pattern is reached only through "use instead": as a mere fallback it would
 *       turn any blocked lift into, say, arm bike intervals carrying the lift's kilograms. The load is
 *       resolved again for the new exercise;
 *   (d) otherwise the set is dropped, with a note.
 * The loop checks again after each round of fixes until the engine blocks none of the session's sets;
 * a set still blocked after the last round is dropped, so what is returned always passes the engine.
 *
 * Decisions: an athlete Out on the date gets an empty session, state 'out' and no changes (the grid
 * says "Out"; there is nothing to review line by line). A target RPE over an RPE cap is lowered to the
 * cap, and a set with no RPE to read under an RPE cap gets the cap as its target (the engine's own
 * fix) — both reported as 'load_lowered'. Granted exceptions play no part. The team's row and set ids
 * are kept; a swap changes the whole row (a row has one exercise).
 */
export function fitTeamSession(
  team: { id: string; date: string; content: SessionContent },
  ctx: EngineContext,
  opts: {
    /** The athlete's other sets of the same weeks, counted toward weekly limits, as engine sets or as sessions. */
    otherSets?: EngineSet[];
    otherSessions?: readonly SessionOf[];
    rules?: PreparedRules;
    /** The plain path: every set checked again in every round with every other set, a row no rule touches kept with slots; the same answer, slower (for the test that says so). */
    recheckEverySet?: boolean;
  } = {},
): FittedSession {
  // The athlete's rules, prepared once for all the sessions fitted to them (a squad's program), or for this one.
  const prepared = opts.rules?.fits(ctx) ? opts.rules : new PreparedRules(ctx);
  if (prepared.outOn(team.date)) return { content: { exercises: [] }, changes: [], state: 'out' };
  const engine: EngineContext = ctx.waivedSetIds === undefined ? ctx : { ...ctx, waivedSetIds: undefined };
  const unit = ctx.unit ?? 'kg';
  const loads = loadsFor(prepared, ctx.baselines);
  // No stage in force on a calendar day (and not Out): most versions of a team session. When every
  // exercise is known and every set reads, nothing can breach: the version is the session as written.
  if (ctx.plans.length === 0 || prepared.on(team.date)?.stages.day.stages.length === 0) {
    const content = prepared.on(team.date) !== null ? asWrittenContent(team.content, ctx, loads) : null;
    if (content) return { content, changes: [], state: 'as_written' };
  }
  // No plan and every exercise known: the check runs with no day (nothing to read rules from).
  const stages = ctx.plans.length === 0 && allKnown(team.content, ctx) ? undefined : stagesOn(prepared, team.date);
  const day = stages?.day;
  // On a calendar day with stages in force, a row no rule touches is kept as written, without slots (see
  // newRow); the plain path keeps slots for every row.
  const lean =
    !opts.recheckEverySet && stages && day && day.stages.length > 0 && prepared.on(team.date) !== null ? { stages, prepared } : null;
  const rows: Row[] = [];
  for (const r of team.content.exercises) rows.push(newRow(r, ctx, loads, lean));
  if (!stages || !day || day.stages.length === 0) {
    // No stage in force and not Out: nothing can be capped or blocked, only an unknown exercise or an
    // unreadable set can breach. Most versions of a team session are this; when every set reads,
    // the engine would find nothing, so it is not asked (the hot path of a squad's fitting).
    if (allReadable(team, rows, prepared)) return finish(rows, unit, ctx, loads);
    fitLoop(team, rows, engine, [], prepared, loads, stages, opts.recheckEverySet);
    return finish(rows, unit, ctx, loads);
  }
  // Other sets matter only for weekly hard-set limits: passed to the check only when one is in force.
  // On the fast path only the other sets that can change a count this session reads (see otherSetsOf).
  const week = opts.recheckEverySet ? undefined : prepared.on(team.date)?.week;
  const others = weeklyLimit(day) ? otherSetsOf(opts, team, week === undefined ? null : { prepared, week }) : [];
  fitLoop(team, rows, engine, others, prepared, loads, stages, opts.recheckEverySet);
  return finish(rows, unit, ctx, loads);
}

/** Every exercise of the session is in the library. */
function allKnown(content: SessionContent, ctx: EngineContext): boolean {
  for (const r of content.exercises) if (!ctx.exercises[r.exerciseId]) return false;
  return true;
}

/** The stages in force on the date as the engine reads them; for a date that is not a calendar day, as inForceOn reads it. */
function stagesOn(prepared: PreparedRules, date: string): StageRules {
  return prepared.on(date)?.stages ?? { day: inForceOn(prepared.plans, date), exercises: new Map() };
}

const MAX_ROUNDS = 12;
const MAX_SWAP_CANDIDATES = 8;

/** Rounds of check-and-fix; the number of rounds run. */
function fitLoop(
  team: { id: string; date: string },
  rows: Row[],
  ctx: EngineContext,
  others: EngineSet[],
  prepared: PreparedRules,
  loads: ResolvedLoads,
  stages: StageRules | undefined,
  recheckEverySet = false,
): number {
  const day = stages?.day;
  // No closures made per call here or in finish (each is named, and costs, under tsx): this runs per session.
  const validDate = prepared.on(team.date) !== null;
  const untouchedIn = validDate && stages ? { stages, prepared } : null;
  // Whether only changed sets are checked (below); worked out again only after a swap changes a row's exercise.
  let perSet: boolean | undefined;
  for (let round = 0; ; round++) {
    // With no counted limit on any of the session's exercises (and no other sets counted), the engine
    // reads each set on its own: a set that passed and has not changed since passes again, and only the
    // sets changed by the last round are checked. Otherwise the whole session is checked again.
    perSet ??= !recheckEverySet && validDate && stages !== undefined && others.length === 0 && noCountedLimit(rows, prepared, stages);
    const sets = engineSetsOf(team, rows, untouchedIn, perSet);
    // Nothing left that a rule in force touches: the engine would find nothing against the session.
    if (sets.length === 0) return round;
    // The other sessions' sets first: they are of earlier days, so the check finds them in order (the
    // order of its input does not change its answer).
    const all = checkSetsToFit(others.length ? [...others, ...sets] : sets, ctx, prepared);
    if (all.length === 0) return round;
    // Only the session's own blocking breaches are fixed (the other sessions' sets are checked with it,
    // not changed), by set; counted limits are read last: lighter or swapped sets may no longer count.
    let ours: Set<string> | null = null;
    if (others.length > 0) {
      ours = new Set();
      for (const s of sets) ours.add(s.id);
    }
    let bySet: Map<string, Breach[]> | null = null;
    let onlyCounts = true;
    for (const b of all) {
      if (b.waived || (ours !== null && !ours.has(b.setId))) continue;
      if (!COUNT_RULES.has(b.rule)) onlyCounts = false;
      const list = (bySet ??= new Map()).get(b.setId);
      if (list) list.push(b);
      else bySet.set(b.setId, [b]);
    }
    if (bySet === null) return round;
    // What passed as it stands: the sets checked without a breach, and those of rows no rule touches
    // (left out of the check because the engine can find nothing against them).
    if (perSet)
      for (const row of rows)
        for (const slot of row.slots)
          if (slot.set !== null && !bySet.has(slot.set.id)) {
            slot.passed = slot.set;
            slot.passedAs = row.exerciseId;
          }
    const last = round >= MAX_ROUNDS;
    for (const row of rows) {
      // Made only for a row to swap (most rows have none).
      let swapWhy: string[] | null = null;
      for (const slot of row.slots) {
        const bs = slot.set && bySet.get(slot.set.id);
        if (!bs) continue;
        if (last) {
          drop(slot, bs.map(noteOf));
          continue;
        }
        const action = fixSet(slot, bs, row, ctx, prepared, stages, onlyCounts);
        if (action === 'swap') {
          swapWhy ??= [];
          for (const b of bs) if (!COUNT_RULES.has(b.rule)) swapWhy.push(noteOf(b));
        }
      }
      if (swapWhy !== null) {
        swapOrDrop(row, swapWhy, ctx, day, bySet, loads);
        perSet = undefined;
      }
    }
  }
}

/** No counted limit (sets per session, hard sets per week) on any of the rows' exercises. */
function noCountedLimit(rows: Row[], prepared: PreparedRules, stages: StageRules): boolean {
  for (const r of rows) if (r.ex && counts(prepared.rulesFor(stages, r.ex))) return false;
  return true;
}

/** (c) the next allowed exercise for the whole row, its sets resolved again from the team's; (d) drop the blocked sets when none is left. */
function swapOrDrop(
  row: Row,
  why: string[],
  ctx: EngineContext,
  day: InForce | undefined,
  bySet: Map<string, Breach[]>,
  loads: ResolvedLoads,
) {
  const original = ctx.exercises[row.teamExerciseId];
  if (row.swaps === null) row.swaps = [...swapCandidates(row.teamExerciseId, ctx, day, MAX_SWAP_CANDIDATES)];
  row.swapNotes = row.swapNotes.concat(why);
  const nextId = row.swaps.shift();
  if (nextId === undefined) {
    for (const slot of row.slots) if (slot.set && bySet.has(slot.set.id)) drop(slot, why);
    return;
  }
  const ex = ctx.exercises[nextId];
  row.exerciseId = nextId;
  row.ex = ex;
  const fromOneRm = original ? oneRmFor(original, ctx.baselines) : undefined;
  const toOneRm = oneRmFor(ex, ctx.baselines);
  for (const slot of row.slots) {
    if (slot.removed === 'sets_cut') continue;
    let load = slot.team.load;
    // An absolute load keeps its intensity when both exercises have a 1RM: the same % of the new one.
    if ((load.kind === 'kg' || load.kind === 'lb') && fromOneRm !== undefined && toOneRm !== undefined)
      load = { kind: 'percent', value: Math.min(110, (plannedKg(load, undefined)! / fromOneRm) * 100) };
    // Resolved as resolveLoad does, kept per exercise and % for the athlete (the same few loads in every session).
    slot.set = { ...slot.team, load: loads.of(load, ex) };
    slot.removed = null;
    slot.repsCut = false;
  }
}
