/**
 * The independent checker: what an athlete may do on a date, written again from the plan data the
 * test sent, in the plainest way (every applicable rule is tried on its own; a set breaches if any
 * rule says so). It deliberately does not call policies/load: it exists to catch the app when the
 * app's engine is fed the wrong data or is not asked at all.
 *
 * The rules, as the product states them (PRODUCT.md, "the story"; policies/load/compliance.ts):
 * - a set is checked against every stage in force on its own date, across the plans of all the
 *   athlete's open cases (a case closed on D stops counting from D; the test closes only on today);
 * - the status on a date is, per open case, the last decision recorded that is in effect that day,
 *   and across cases the most restrictive. Out blocks every set on a day no plan stage covers; on a
 *   day a stage covers, the stage says what is allowed (the engine's rule; PRODUCT.md says "Out"
 *   without more);
 * - blocked patterns block; capped patterns cap: % of 1RM (needs a baseline of the exercise's
 *   reference lift, else the set breaches), absolute load (a % load needs a baseline too), RPE, reps
 *   per set, sets per session, hard sets (RPE ≥ 7) per ISO week, impact for ballistic exercises;
 * - sets per session and per week are counted per capped pattern, in the order date, session id,
 *   position; a blocked set (or one on an Out day) does not count, because it cannot be done;
 * - a set covered by a granted exception (for that athlete, and unchanged since the grant) is
 *   waived: it still counts, but does not breach.
 *
 * Every generated set carries a target RPE, so the model never estimates an RPE from %1RM and reps
 * (the NSCA table); that part of the engine is left to its unit tests.
 */
import {
  exerciseOf,
  mondayOf,
  todayOf,
  type Caps,
  type Model,
  type Pattern,
  type SessionView,
  type SetM,
  type Stage,
  type Status,
} from './model';

const SEVERITY: Record<Status, number> = { full: 0, limited: 1, out: 2 };
/** Loads and percentages are compared with a little room, as any float comparison of a cap. */
const EPS = 1e-6;
export const HARD_RPE = 7;

export function statusOn(m: Model, athleteId: string, date: string): Status {
  let worst: Status = 'full';
  for (const c of m.cases) {
    if (c.athleteId !== athleteId || c.closed) continue;
    let current: Status | null = null;
    for (const s of c.statuses) if (s.from <= date) current = s.status;
    if (current && SEVERITY[current] > SEVERITY[worst]) worst = current;
  }
  return worst;
}

export function stagesOn(m: Model, athleteId: string, date: string): Stage[] {
  return m.cases
    .filter((c) => c.athleteId === athleteId && !c.closed && c.plan)
    .flatMap((c) => c.plan!.stages.filter((s) => s.startDate <= date && date <= s.endDate));
}

/** The latest baseline (by test date, then as recorded) of the lift that sets the exercise's intensity. */
export function oneRmOf(m: Model, athleteId: string, exerciseId: string): number | undefined {
  const ex = exerciseOf(m, exerciseId);
  const lift = ex.referenceId ?? ex.id;
  let best: { testedOn: string; seq: number; e1rmKg: number } | undefined;
  for (const b of m.baselines) {
    if (b.athleteId !== athleteId || b.exerciseId !== lift) continue;
    if (!best || b.testedOn > best.testedOn || (b.testedOn === best.testedOn && b.seq > best.seq)) best = b;
  }
  return best?.e1rmKg;
}

/** A set as a grant sees it: what, when, how many, how heavy, how hard. */
export const setKey = (exerciseId: string, date: string, s: SetM) => JSON.stringify([exerciseId, date, s.reps, s.load, s.targetRpe]);

export function waivedSets(m: Model, athleteId: string, s: SessionView): Set<string> {
  const out = new Set<string>();
  for (const x of m.exceptions) {
    if (x.sessionId !== s.id || x.athleteId !== athleteId || x.status !== 'granted') continue;
    for (const b of s.blocks) for (const set of b.sets) if (x.granted[set.id] === setKey(b.exerciseId, s.date, set)) out.add(set.id);
  }
  return out;
}

export interface Breach {
  sessionId: string;
  setId: string;
  rule: string;
}

/** Every breach (waived or not) of the given sessions for one athlete; weekly counts span all of them. */
export function breaches(m: Model, athleteId: string, sessions: SessionView[]): Breach[] {
  const sets = sessions.flatMap((session) => {
    let order = 0;
    return session.blocks.flatMap((b) => b.sets.map((set) => ({ session, exerciseId: b.exerciseId, set, order: order++ })));
  });
  const cmp = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);
  sets.sort((a, b) => cmp(a.session.date, b.session.date) || cmp(a.session.id, b.session.id) || a.order - b.order);
  const counts = new Map<string, number>();
  const bump = (key: string) => {
    const n = (counts.get(key) ?? 0) + 1;
    counts.set(key, n);
    return n;
  };
  const out: Breach[] = [];
  for (const { session, exerciseId, set } of sets) {
    const add = (rule: string) => out.push({ sessionId: session.id, setId: set.id, rule });
    const ex = exerciseOf(m, exerciseId);
    const stages = stagesOn(m, athleteId, session.date);
    if (stages.length === 0 && statusOn(m, athleteId, session.date) === 'out') {
      add('Out, and no plan stage says what is allowed');
      continue;
    }
    const rules = ex.patterns.flatMap((p) => stages.map((s) => [p, s.patterns[p]] as const)).filter(([, r]) => r !== undefined);
    if (rules.some(([, r]) => r!.mode === 'blocked')) {
      add('blocked pattern');
      continue;
    }
    const capped: [Pattern, Caps][] = rules.flatMap(([p, r]) => (r!.mode === 'capped' ? [[p, r!.caps] as [Pattern, Caps]] : []));
    if (ex.ballistic && capped.some(([, c]) => c.impactAllowed === false)) add('impact not allowed');
    const oneRm = oneRmOf(m, athleteId, exerciseId);
    const kg = set.load.kind === 'kg' ? set.load.value : oneRm === undefined ? null : (set.load.value / 100) * oneRm;
    const percent = set.load.kind === 'percent' ? set.load.value : oneRm === undefined ? null : (set.load.value / oneRm) * 100;
    for (const [, c] of capped) {
      if (c.maxPercent1RM !== undefined) {
        if (percent === null || oneRm === undefined) add('% of 1RM cap and no baseline');
        else if (percent > c.maxPercent1RM + EPS) add(`over ${c.maxPercent1RM}% of ${oneRm} kg`);
      }
      if (c.maxLoadKg !== undefined) {
        if (kg === null) add('load cap, a % load and no baseline');
        else if (kg > c.maxLoadKg + EPS) add(`over ${c.maxLoadKg} kg`);
      }
      if (c.maxRpe !== undefined && set.targetRpe > c.maxRpe) add(`over RPE ${c.maxRpe}`);
      if (c.maxRepsPerSet !== undefined && set.reps > c.maxRepsPerSet) add(`over ${c.maxRepsPerSet} reps`);
    }
    for (const p of new Set(capped.map(([q]) => q))) {
      const mine = capped.filter(([q]) => q === p).map(([, c]) => c);
      const inSession = bump(`s ${session.id} ${p}`);
      if (mine.some((c) => c.maxSetsPerSession !== undefined && inSession > c.maxSetsPerSession))
        add(`${p}: set ${inSession} of the session`);
      if (set.targetRpe < HARD_RPE) continue;
      const inWeek = bump(`w ${mondayOf(session.date)} ${p}`);
      if (mine.some((c) => c.maxHardSetsPerWeek !== undefined && inWeek > c.maxHardSetsPerWeek))
        add(`${p}: hard set ${inWeek} of the week of ${mondayOf(session.date)}`);
    }
  }
  return out;
}

/** The athlete's published sessions of the ISO week of `date`, other than `exceptId`, as the model has them. */
export function publishedInWeek(m: Model, athleteId: string, date: string, exceptId: string): SessionView[] {
  return m.sessions.filter(
    (s) =>
      s.published &&
      s.id !== exceptId &&
      mondayOf(s.date) === mondayOf(date) &&
      m.programs.some((p) => p.id === s.programId && p.athleteIds.includes(athleteId)),
  );
}

/** Unwaived breaches of one session for one athlete, were it published as it stands (publish and edit are checked so). */
export function blockingBreaches(m: Model, athleteId: string, session: SessionView): Breach[] {
  const others = publishedInWeek(m, athleteId, session.date, session.id);
  const today = todayOf(m);
  const dateOf = new Map(others.map((o) => [o.id, o.date]));
  const waivedIn = new Map(others.map((o) => [o.id, waivedSets(m, athleteId, o)]));
  const own = waivedSets(m, athleteId, session);
  // A change is refused for its own unwaived breaches, and for those it newly causes in a later
  // published session of the week from today on (the weekly hard-set count runs in date order).
  const key = (b: Breach) => `${b.setId}:${b.rule}`;
  const before = new Set(breaches(m, athleteId, others).map(key));
  return breaches(m, athleteId, [session, ...others]).filter((b) =>
    b.sessionId === session.id
      ? !own.has(b.setId)
      : (dateOf.get(b.sessionId) ?? '') >= today && !before.has(key(b)) && !waivedIn.get(b.sessionId)!.has(b.setId),
  );
}
