/**
 * Team fitting timing (target: within 3× the engine-only check of the same sets): a 12-week team program of 4
 * sessions a week fitted for 60 athletes, side by side in the same run with the compliance engine only
 * checking the same individual sets (each athlete's fitted program, checked once as a publish would).
 * Everything is generated from a fixed seed, so two runs time the same work. Reported, never asserted; the
 * one thing checked is that every fitted program passes the engine (the fitting's own guarantee), so the
 * bench times real work.
 *
 *   node --import tsx bench/team-fit.ts          (alone)
 *   npm run bench                                  (with the other benchmarks)
 */
import {
  blockingBreaches,
  checkSets,
  prepareRules,
  type EngineContext,
  type EngineExercise,
  type EngineSet,
} from '../policies/load/compliance';
import type { PlanInput, PlanStage } from '../policies/load/in-force';
import type { ParticipationStatus } from '../policies/load/patterns';
import { sessionEngineSets, type PlannedLoad } from '../policies/load/sets';
import { KETTLEBELL_KG } from '../policies/load/steps';
import { fitTeamSession } from '../policies/load/team-fit';
import type { FitState } from '../policies/load/team-fit-types';
import type { SessionContent } from '../policies/schemas/programs';

/** mulberry32: a small seeded generator, so the program and the athletes are the same on every run. */
function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const kg25 = { kind: 'increment' as const, step: 2.5, unit: 'kg' as const };
const x = (id: string, name: string, patterns: EngineExercise['patterns'], more: Partial<EngineExercise> = {}): EngineExercise => ({
  id,
  name,
  patterns,
  ballistic: false,
  steps: kg25,
  ...more,
});
/** A small strength-and-conditioning library: the team's lifts, their alternatives, and pattern-free conditioning. */
const LIBRARY: EngineExercise[] = [
  x('sq', 'Back squat', ['squat'], { useInstead: ['gsq', 'lp'] }),
  x('fsq', 'Front squat', ['squat'], { referenceId: 'sq' }),
  x('gsq', 'Goblet squat', ['squat'], { steps: { kind: 'list', valuesKg: KETTLEBELL_KG } }),
  x('lp', 'Leg press', ['squat']),
  x('dl', 'Deadlift', ['hinge'], { useInstead: ['tb'] }),
  x('rdl', 'Romanian deadlift', ['hinge'], { referenceId: 'dl' }),
  x('tb', 'Trap-bar deadlift', ['hinge', 'squat']),
  x('ht', 'Hip thrust', ['hinge']),
  x('bp', 'Bench press', ['horizontal_push'], { useInstead: ['dbp'] }),
  x('dbp', 'Dumbbell bench press', ['horizontal_push'], { steps: { kind: 'increment', step: 2, unit: 'kg' } }),
  x('ohp', 'Overhead press', ['vertical_push'], { steps: { kind: 'increment', step: 5, unit: 'lb' } }),
  x('row', 'Barbell row', ['horizontal_pull']),
  x('pu', 'Pull-up', ['vertical_pull']),
  x('lat', 'Lat pulldown', ['vertical_pull']),
  x('lun', 'Walking lunge', ['lunge']),
  x('split', 'Split squat', ['lunge', 'squat']),
  x('carry', "Farmer's carry", ['carry']),
  x('pallof', 'Pallof press', ['rotation']),
  x('bj', 'Box jump', ['jump'], { ballistic: true }),
  x('cmj', 'Countermovement jump', ['jump'], { ballistic: true }),
  x('spr', 'Flying sprint', ['sprint'], { ballistic: true, useInstead: ['bike'] }),
  x('acc', 'Acceleration run', ['sprint'], { ballistic: true }),
  x('mbt', 'Med-ball throw', ['throw'], { ballistic: true }),
  x('kbs', 'Kettlebell swing', ['swing', 'hinge'], { ballistic: true, steps: { kind: 'list', valuesKg: KETTLEBELL_KG } }),
  x('bike', 'Bike intervals', []),
  x('sled', 'Sled push', []),
];
const EXERCISES = Object.fromEntries(LIBRARY.map((e) => [e.id, e]));
/** Lifts with a 1RM (the others read theirs through referenceId, or are loaded in kg or body weight). */
const ONE_RM_BASE: Record<string, number> = {
  sq: 140,
  lp: 220,
  dl: 170,
  tb: 170,
  ht: 160,
  bp: 100,
  dbp: 36,
  ohp: 60,
  row: 90,
  lun: 60,
  split: 70,
};

type Spec = [exerciseId: string, sets: number, reps: number, load: (week: number) => PlannedLoad, rpe: number | null];
const pct = (from: number) => (w: number) => ({
  kind: 'percent' as const,
  value: Math.min(92, from + (w % 4) * 2.5 + Math.floor(w / 4) * 2.5),
});
const kgAt = (from: number) => (w: number) => ({ kind: 'kg' as const, value: from + 2.5 * Math.floor(w / 2) });
const bw = () => ({ kind: 'bodyweight' as const });
/** The four weekly sessions (Mon, Tue, Thu, Fri), 5–6 exercises each: % of 1RM, kg at an RPE, body weight. */
const WEEK: { day: number; rows: Spec[] }[] = [
  {
    day: 0,
    rows: [
      ['bj', 4, 3, bw, null],
      ['sq', 4, 5, pct(70), null],
      ['bp', 4, 5, pct(70), null],
      ['row', 3, 8, kgAt(60), 7],
      ['pallof', 3, 10, kgAt(10), 6],
    ],
  },
  {
    day: 1,
    rows: [
      ['spr', 6, 1, bw, null],
      ['dl', 3, 4, pct(72.5), null],
      ['ohp', 4, 6, kgAt(40), 7],
      ['pu', 4, 6, bw, 8],
      ['lun', 3, 8, kgAt(30), 7],
      ['carry', 3, 1, kgAt(40), 6],
    ],
  },
  {
    day: 3,
    rows: [
      ['cmj', 4, 3, bw, null],
      ['fsq', 4, 4, pct(65), null],
      ['dbp', 3, 10, kgAt(26), 7],
      ['lat', 3, 10, kgAt(50), 7],
      ['ht', 3, 8, pct(70), null],
    ],
  },
  {
    day: 4,
    rows: [
      ['acc', 6, 1, bw, null],
      ['rdl', 3, 6, pct(60), null],
      ['bp', 3, 3, pct(80), null],
      ['split', 3, 6, kgAt(40), 8],
      ['mbt', 3, 5, kgAt(4), null],
      ['kbs', 3, 12, kgAt(16), 7],
    ],
  },
];

const START = Date.UTC(2027, 0, 4); // a Monday
const dayIso = (n: number) => new Date(START + n * 86_400_000).toISOString().slice(0, 10);

export interface TeamSession {
  id: string;
  date: string;
  content: SessionContent;
}
/** The team program: `weeks` × 4 sessions, about 20 sets a session, with set and row ids of its own. */
export function teamProgram(weeks: number): TeamSession[] {
  const sessions: TeamSession[] = [];
  for (let w = 0; w < weeks; w++)
    for (const { day, rows } of WEEK) {
      const id = `w${w}d${day}`;
      sessions.push({
        id,
        date: dayIso(w * 7 + day),
        content: {
          exercises: rows.map(([exerciseId, count, reps, load, rpe], r) => ({
            id: `${id}r${r}`,
            exerciseId,
            sets: Array.from({ length: count }, (_, s) => ({ id: `${id}r${r}s${s}`, reps, load: load(w), targetRpe: rpe })),
          })),
        },
      });
    }
  return sessions;
}

/** The restriction plans of the squad: most athletes have none; the rest a typical return-to-play picture. */
type Kind = 'none' | 'hinge capped' | 'sprint blocked' | 'out for a week' | 'shoulder' | 'knee' | 'squat volume';
/** Ten athletes in a row: four with no plan, one of each other kind (60 athletes: 24 with none, 6 of each). */
const CYCLE: Kind[] = [
  'none',
  'hinge capped',
  'none',
  'sprint blocked',
  'out for a week',
  'none',
  'shoulder',
  'knee',
  'none',
  'squat volume',
];
const stage = (id: string, fromWeek: number, toWeek: number, patterns: PlanStage['patterns']): PlanStage => ({
  id,
  startDate: dayIso(fromWeek * 7),
  endDate: dayIso(toWeek * 7 + 6),
  painCeiling: 3,
  patterns,
});
function plansFor(kind: Kind, weeks: number, r: () => number): { plans: PlanInput[]; outWeek: number | null } {
  const at = (f: number) => Math.min(weeks - 1, Math.floor(f * weeks));
  const p = (...stages: PlanStage[]): PlanInput[] => [{ planId: `plan-${kind}`, caseId: 'case', version: 1, stages }];
  switch (kind) {
    case 'none':
      return { plans: [], outWeek: null };
    case 'hinge capped': {
      const mid = at(0.5);
      return {
        plans: p(
          stage('h1', 0, mid, {
            hinge: { mode: 'capped', caps: { maxPercent1RM: 55 + Math.round(r() * 10), maxRpe: 7 } },
            swing: { mode: 'blocked' },
          }),
          stage('h2', mid + 1, weeks - 1, { hinge: { mode: 'capped', caps: { maxPercent1RM: 75, maxHardSetsPerWeek: 4 } } }),
        ),
        outWeek: null,
      };
    }
    case 'sprint blocked':
      return {
        plans: p(
          stage('s1', 0, at(0.34), { sprint: { mode: 'blocked' }, jump: { mode: 'capped', caps: { impactAllowed: false } } }),
          stage('s2', at(0.34) + 1, weeks - 1, { sprint: { mode: 'capped', caps: { maxSetsPerSession: 3 } } }),
        ),
        outWeek: null,
      };
    case 'out for a week': {
      const w = Math.floor(r() * weeks);
      return {
        plans: w + 1 < weeks ? p(stage('o1', w + 1, Math.min(weeks - 1, w + 2), { squat: { mode: 'capped', caps: { maxRpe: 6 } } })) : [],
        outWeek: w,
      };
    }
    case 'shoulder':
      return {
        plans: p(
          stage('sh1', 0, weeks - 1, {
            vertical_push: { mode: 'blocked' },
            horizontal_push: { mode: 'capped', caps: { maxLoadKg: 50 + Math.round(r() * 4) * 5, maxRepsPerSet: 6 } },
            throw: { mode: 'blocked' },
          }),
        ),
        outWeek: null,
      };
    case 'knee':
      return {
        plans: p(
          stage('k1', 0, at(0.5), {
            lunge: { mode: 'blocked' },
            jump: { mode: 'blocked' },
            squat: { mode: 'capped', caps: { maxPercent1RM: 60, maxRepsPerSet: 5 } },
          }),
          stage('k2', at(0.5) + 1, weeks - 1, {
            jump: { mode: 'capped', caps: { impactAllowed: false } },
            squat: { mode: 'capped', caps: { maxRpe: 8 } },
          }),
        ),
        outWeek: null,
      };
    case 'squat volume':
      return {
        plans: p(stage('v1', 0, weeks - 1, { squat: { mode: 'capped', caps: { maxSetsPerSession: 3, maxHardSetsPerWeek: 5 } } })),
        outWeek: null,
      };
  }
}

export interface Athlete {
  id: string;
  kind: Kind;
  ctx: EngineContext;
}
/** `count` athletes with baselines around the squad's (±25 %, a few lifts never tested) and a plan of the kind CYCLE gives. */
export function squad(count: number, weeks: number, seed = 14): Athlete[] {
  const r = rng(seed);
  return Array.from({ length: count }, (_, i) => {
    const kind = CYCLE[i % CYCLE.length];
    const baselines: Record<string, number> = {};
    for (const [id, kg] of Object.entries(ONE_RM_BASE)) if (r() > 0.05) baselines[id] = Math.round(kg * (0.75 + r() * 0.5));
    const { plans, outWeek } = plansFor(kind, weeks, r);
    const outFrom = outWeek === null ? null : dayIso(outWeek * 7);
    const outTo = outWeek === null ? null : dayIso(outWeek * 7 + 6);
    const statusOn = (d: string): ParticipationStatus =>
      outFrom !== null && outFrom <= d && d <= outTo! ? 'out' : plans.length > 0 ? 'limited' : 'full';
    return { id: `a${i}`, kind, ctx: { plans, exercises: EXERCISES, baselines, statusOn, unit: 'kg' } };
  });
}

/**
 * (a) Every athlete's version of every team session, in date order; the athlete's versions already
 * fitted in the same week count toward weekly limits, as on publish (passed as sessions: the fitting
 * turns them into engine sets only when a weekly limit is in force). Returns each athlete's versions.
 */
export function fitAll(team: TeamSession[], athletes: Athlete[], states?: Map<FitState, number>): TeamSession[][] {
  return athletes.map((a) => {
    const versions: TeamSession[] = [];
    let week = '';
    let weekSessions: TeamSession[] = [];
    // The athlete's rules worked out once for all their sessions (as a publish to the squad does).
    const rules = prepareRules(a.ctx);
    for (const t of team) {
      const w = t.id.slice(0, t.id.indexOf('d'));
      if (w !== week) {
        week = w;
        weekSessions = [];
      }
      const fitted = fitTeamSession(t, a.ctx, { otherSessions: weekSessions, rules });
      if (states) states.set(fitted.state, (states.get(fitted.state) ?? 0) + 1);
      const version = { id: t.id, date: t.date, content: fitted.content };
      weekSessions.push(version);
      versions.push(version);
    }
    return versions;
  });
}

/** Each athlete's versions as the engine reads them (what a publish checks). */
export const setsOf = (versions: TeamSession[][]): EngineSet[][] => versions.map((v) => v.flatMap(sessionEngineSets));

/** (b) The engine only checking the same individual sets: each athlete's fitted program, once. */
export function checkAll(sets: EngineSet[][], athletes: Athlete[]): number {
  let blocking = 0;
  athletes.forEach((a, i) => (blocking += blockingBreaches(checkSets(sets[i], a.ctx)).length));
  return blocking;
}

const stats = (times: number[]) => {
  const s = [...times].sort((a, b) => a - b);
  return { min: s[0], median: s[Math.floor(s.length / 2)], p95: s[Math.min(s.length - 1, Math.ceil(s.length * 0.95) - 1)] };
};

export function timeTeamFit(athleteCount: number, weeks: number, runs: number, warmUp = 3) {
  const team = teamProgram(weeks);
  const athletes = squad(athleteCount, weeks);
  const states = new Map<FitState, number>();
  const sets = setsOf(fitAll(team, athletes, states));
  const blocking = checkAll(sets, athletes);
  for (let i = 1; i < warmUp; i++) checkAll(setsOf(fitAll(team, athletes)), athletes);
  const fitTimes: number[] = [];
  const checkTimes: number[] = [];
  // Alternated in one loop, so both see the same state of the machine.
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    fitAll(team, athletes);
    const t1 = performance.now();
    checkAll(sets, athletes);
    checkTimes.push(performance.now() - t1);
    fitTimes.push(t1 - t0);
  }
  const teamSets = team.reduce((k, t) => k + t.content.exercises.reduce((j, e) => j + e.sets.length, 0), 0);
  return {
    athletes: athleteCount,
    weeks,
    sessions: team.length,
    teamSets,
    individualSets: sets.reduce((k, s) => k + s.length, 0),
    blocking,
    states,
    kinds: athletes.reduce((m, a) => m.set(a.kind, (m.get(a.kind) ?? 0) + 1), new Map<Kind, number>()),
    fit: stats(fitTimes),
    check: stats(checkTimes),
  };
}

const ms = (v: number) => `${v.toFixed(1)} ms`;

if (import.meta.url === `file://${process.argv[1]}`) {
  const runs = Number(process.env.BENCH_RUNS ?? 20);
  const main = timeTeamFit(60, 12, runs);
  console.log(
    `Team program: ${main.weeks} weeks × 4 sessions = ${main.sessions} sessions, ${main.teamSets} sets; ${main.athletes} athletes (${[...main.kinds].map(([k, v]) => `${v} ${k}`).join(', ')})`,
  );
  console.log(`Versions: ${[...main.states].map(([k, v]) => `${v} ${k}`).join(', ')}; ${main.individualSets} individual sets`);
  console.log(`Fitted programs failing the engine: ${main.blocking} blocking breaches (must be 0)`);
  console.log(
    `(a) fitting every version        median ${ms(main.fit.median)}  p95 ${ms(main.fit.p95)}  min ${ms(main.fit.min)}   (${runs} runs after a warm-up)`,
  );
  console.log(`(b) engine checking the same sets median ${ms(main.check.median)}  p95 ${ms(main.check.p95)}  min ${ms(main.check.min)}`);
  console.log(
    `ratio (a)/(b): medians ${(main.fit.median / main.check.median).toFixed(2)}×, minimums ${(main.fit.min / main.check.min).toFixed(2)}× (target: within 3×)`,
  );
  console.log('\nScaling, fitting median (µs per athlete-session) | engine median:');
  console.log(`athletes ${[4, 8, 12].map((w) => `${w} weeks`.padStart(30)).join('')}`);
  for (const a of [15, 30, 60]) {
    const cells = [4, 8, 12].map((w) => {
      const r = a === 60 && w === 12 ? main : timeTeamFit(a, w, Math.max(5, Math.round((runs * 60 * 12) / (a * w) / 4)));
      const per = (r.fit.median * 1000) / (a * r.sessions);
      return `${ms(r.fit.median)} (${per.toFixed(0)} µs) | ${ms(r.check.median)}`.padStart(30);
    });
    console.log(`${String(a).padStart(8)} ${cells.join('')}`);
  }
  if (main.blocking > 0) process.exit(1);
}
