import { describe, expect, it } from 'vitest';
import { blockingBreaches, checkSets, type EngineContext } from './compliance';
import { ex, library, plan, stage } from './compliance-fixtures';
import type { PlanStage } from './in-force';
import { sessionEngineSets, type EngineSet } from './sets';
import { fitTeamSession } from './team-fit';
import type { SessionContent } from '../schemas/programs';

// The fitting order of a team session for one athlete (team-fit.ts), one hand-built case per step.
const sprint = ex('spr', 'Flying sprint', ['sprint'], { ballistic: true, useInstead: ['bike'] });
const bike = ex('bike', 'Assault bike intervals', []);
const legPress = ex('lp', 'Leg press', ['squat']);
const squatUse = ex('sq', 'Back squat', ['squat'], { useInstead: ['lp'] });
const lib = [...library.filter((e) => e.id !== 'sq'), squatUse, sprint, bike, legPress];
const exs = Object.fromEntries(lib.map((e) => [e.id, e]));

const DATE = '2026-03-04'; // a Wednesday, inside the fixtures' stage (2–29 March 2026)
const c = (patterns: PlanStage['patterns'], baselines: Record<string, number> = {}, more: Partial<EngineContext> = {}): EngineContext => ({
  plans: Object.keys(patterns).length ? plan(stage(patterns)) : [],
  exercises: exs,
  baselines,
  ...more,
});
type Row = {
  exerciseId: string;
  sets: { reps: number; load: SessionContent['exercises'][number]['sets'][number]['load']; targetRpe?: number | null }[];
};
const team = (rows: Row[]) => ({
  id: 'team-wed',
  date: DATE,
  content: {
    exercises: rows.map((r, i) => ({
      id: `row${i}`,
      exerciseId: r.exerciseId,
      sets: r.sets.map((s, j) => ({ id: `row${i}-set${j}`, targetRpe: null, ...s })),
    })),
  } satisfies SessionContent,
});
const times = (count: number, s: Row['sets'][number]) => Array.from({ length: count }, () => ({ ...s }));
const passes = (fitted: SessionContent, ctx: EngineContext, others: EngineSet[] = []) => {
  const sets = sessionEngineSets({ id: 'team-wed', date: DATE, content: fitted });
  const ids = new Set(sets.map((s) => s.id));
  return blockingBreaches(checkSets([...sets, ...others], ctx)).filter((b) => ids.has(b.setId));
};

describe('fitTeamSession', () => {
  it('an athlete without limits gets the team session as written; a % of 1RM becomes the nearest 2.5 kg step (common practice)', () => {
    const t = team([
      { exerciseId: 'dl', sets: times(3, { reps: 5, load: { kind: 'percent', value: 75 } }) },
      { exerciseId: 'bp', sets: times(2, { reps: 8, load: { kind: 'kg', value: 60 }, targetRpe: 7 }) },
    ]);
    const fit = fitTeamSession(t, c({}, { dl: 143 }));
    expect(fit.state).toBe('as_written');
    expect(fit.changes).toEqual([]);
    // 75 % of 143 kg = 107.25 kg → nearest 2.5 kg step 107.5 kg.
    expect(fit.content.exercises[0].sets.map((s) => s.load)).toEqual(
      times(3, { reps: 5, load: { kind: 'kg', value: 107.5 } }).map((s) => s.load),
    );
    expect(fit.content.exercises[1]).toEqual(t.content.exercises[1]);
  });

  it("an athlete whose plan touches none of the session's exercises gets the team session unchanged; an unreadable set is still dropped", () => {
    const t = team([
      { exerciseId: 'bp', sets: times(3, { reps: 8, load: { kind: 'kg', value: 60 }, targetRpe: 7 }) },
      { exerciseId: 'bj', sets: times(2, { reps: 3, load: { kind: 'bodyweight' } }) },
    ]);
    // A hinge cap and a sprint block are in force: the bench press and the box jump are not theirs.
    const ctx = c({ hinge: { mode: 'capped', caps: { maxPercent1RM: 60, maxHardSetsPerWeek: 2 } }, sprint: { mode: 'blocked' } });
    expect(fitTeamSession(t, ctx)).toEqual({ content: t.content, changes: [], state: 'as_written' });
    const bad = team([{ exerciseId: 'bp', sets: [{ reps: 0, load: { kind: 'kg', value: 60 } }] }]);
    for (const ctxBad of [ctx, c({})]) {
      const fit = fitTeamSession(bad, ctxBad);
      expect(fit.state).toBe('needs_decision');
      expect(fit.changes[0]).toMatchObject({
        kind: 'dropped',
        note: 'Bench press: this set cannot be checked: its reps are not a whole number of at least 1. Fix the set.',
      });
    }
  });

  it('without a 1RM the % stays a % (resolution needs a baseline)', () => {
    const t = team([{ exerciseId: 'dl', sets: [{ reps: 5, load: { kind: 'percent', value: 75 } }] }]);
    expect(fitTeamSession(t, c({})).content).toEqual(t.content);
  });

  it('Out on the date: state out, no exercises, no changes', () => {
    const t = team([{ exerciseId: 'dl', sets: [{ reps: 5, load: { kind: 'kg', value: 60 } }] }]);
    expect(fitTeamSession(t, c({}, {}, { statusOn: () => 'out' }))).toEqual({ content: { exercises: [] }, changes: [], state: 'out' });
  });

  it('(a) a load over a % cap becomes the largest load that fits, rounded down: 60 % of 143 kg = 85.8 kg → 85 kg', () => {
    const t = team([{ exerciseId: 'dl', sets: times(3, { reps: 5, load: { kind: 'percent', value: 75 }, targetRpe: 6 }) }]);
    const ctx = c({ hinge: { mode: 'capped', caps: { maxPercent1RM: 60 } } }, { dl: 143 });
    const fit = fitTeamSession(t, ctx);
    expect(fit.state).toBe('fitted');
    expect(fit.content.exercises[0].sets.map((s) => s.load)).toEqual(
      times(3, { reps: 5, load: { kind: 'kg', value: 85 } }).map((s) => s.load),
    );
    expect(fit.changes).toHaveLength(3);
    expect(fit.changes[0]).toMatchObject({
      kind: 'load_lowered',
      before: '107.5 kg × 5 at RPE 6',
      after: '85 kg × 5 at RPE 6',
      teamSetId: 'row0-set0',
    });
    expect(fit.changes[0].note).toMatch(/^Hinge: max 60% of 143 kg/);
    expect(passes(fit.content, ctx)).toEqual([]);
  });

  it('(a) a % that only rounds over the cap is still the prescription, not a change: 60 % of 143 kg with a 60 % cap → 85 kg', () => {
    const t = team([{ exerciseId: 'dl', sets: [{ reps: 3, load: { kind: 'percent', value: 60 }, targetRpe: 5 }] }]);
    const fit = fitTeamSession(t, c({ hinge: { mode: 'capped', caps: { maxPercent1RM: 60 } } }, { dl: 143 }));
    expect(fit.content.exercises[0].sets[0].load).toEqual({ kind: 'kg', value: 85 });
    expect(fit.changes).toEqual([]);
    expect(fit.state).toBe('as_written');
  });

  it('(b) a rep cap cuts the reps', () => {
    const t = team([{ exerciseId: 'dl', sets: times(2, { reps: 10, load: { kind: 'kg', value: 40 }, targetRpe: 6 }) }]);
    const ctx = c({ hinge: { mode: 'capped', caps: { maxRepsPerSet: 6 } } });
    const fit = fitTeamSession(t, ctx);
    expect(fit.content.exercises[0].sets.map((s) => s.reps)).toEqual([6, 6]);
    expect(fit.changes.map((x) => x.kind)).toEqual(['reps_cut', 'reps_cut']);
    expect(fit.state).toBe('fitted');
  });

  it('(b) an RPE cap cuts the reps when no load fits the planned reps: kettlebells from 16 kg, 1RM 24 kg, 30 reps under RPE 7', () => {
    // 16 kg = 66.7 % of 24 kg: about 14 reps possible (NSCA %1RM–reps table, extended past 15 reps along its last segment), so
    // 30 reps is RPE 10; at RPE 7 or easier the most reps at 16 kg are those with 3 in reserve.
    const kb = ex('kbg', 'Kettlebell goblet squat', ['squat'], { steps: { kind: 'list', valuesKg: [16, 20, 24] } });
    const ctx: EngineContext = { ...c({ squat: { mode: 'capped', caps: { maxRpe: 7 } } }, { kbg: 24 }), exercises: { ...exs, kbg: kb } };
    const t = team([{ exerciseId: 'kbg', sets: [{ reps: 30, load: { kind: 'kg', value: 16 } }] }]);
    const fit = fitTeamSession(t, ctx);
    const s = fit.content.exercises[0].sets[0];
    expect(s.load).toEqual({ kind: 'kg', value: 16 });
    expect(s.reps).toBeLessThan(30);
    expect(fit.changes[0].kind).toBe('reps_cut');
    expect(passes(fit.content, ctx)).toEqual([]);
  });

  it("(b) a weekly hard-set cap cuts the sets beyond it, counting the athlete's other sets of the week", () => {
    const t = team([{ exerciseId: 'dl', sets: times(4, { reps: 5, load: { kind: 'kg', value: 60 }, targetRpe: 8 }) }]);
    const ctx = c({ hinge: { mode: 'capped', caps: { maxHardSetsPerWeek: 5 } } });
    const monday: EngineSet[] = [0, 1, 2].map((i) => ({
      id: `mon${i}`,
      sessionId: 'mon',
      date: '2026-03-02',
      exerciseId: 'dl',
      reps: 5,
      load: { kind: 'kg', value: 60 },
      targetRpe: 8,
      order: i,
    }));
    const fit = fitTeamSession(t, ctx, { otherSets: monday });
    expect(fit.content.exercises[0].sets.map((s) => s.id)).toEqual(['row0-set0', 'row0-set1']);
    expect(fit.changes.map((x) => [x.kind, x.teamSetId, x.after])).toEqual([
      ['sets_cut', 'row0-set2', null],
      ['sets_cut', 'row0-set3', null],
    ]);
    expect(fit.state).toBe('fitted');
    expect(passes(fit.content, ctx, monday)).toEqual([]);
  });

  it('(b) a per-session set cap cuts the sets beyond it', () => {
    const t = team([{ exerciseId: 'dl', sets: times(5, { reps: 5, load: { kind: 'kg', value: 60 }, targetRpe: 6 }) }]);
    const fit = fitTeamSession(t, c({ hinge: { mode: 'capped', caps: { maxSetsPerSession: 3 } } }));
    expect(fit.content.exercises[0].sets).toHaveLength(3);
    expect(fit.changes.map((x) => x.kind)).toEqual(['sets_cut', 'sets_cut']);
  });

  it('(c) a squat that cannot be read against its % cap is swapped to its "use instead" exercise first, its % resolved on the new 1RM', () => {
    const t = team([{ exerciseId: 'sq', sets: times(2, { reps: 5, load: { kind: 'percent', value: 70 }, targetRpe: 6 }) }]);
    // The back squat has no baseline under a % cap (the engine's no_baseline): only another exercise can help.
    const blocked = c({ squat: { mode: 'capped', caps: { maxPercent1RM: 80 } } }, { lp: 200 });
    const fit = fitTeamSession(t, blocked);
    expect(fit.content.exercises[0].exerciseId).toBe('lp');
    // 70 % of 200 kg = 140 kg.
    expect(fit.content.exercises[0].sets[0].load).toEqual({ kind: 'kg', value: 140 });
    expect(fit.changes[0]).toMatchObject({ kind: 'swapped', swappedToExerciseId: 'lp', before: 'Back squat: 70% of 1RM × 5 at RPE 6' });
    expect(fit.changes[0].after).toBe('Leg press: 140 kg × 5 at RPE 6');
    expect(passes(fit.content, blocked)).toEqual([]);
  });

  it('(c) a sprint under a sprint block becomes its "use instead" conditioning piece with no movement pattern (allowed everywhere)', () => {
    const t = team([{ exerciseId: 'spr', sets: times(6, { reps: 1, load: { kind: 'bodyweight' } }) }]);
    const ctx = c({ sprint: { mode: 'blocked' } });
    const fit = fitTeamSession(t, ctx);
    expect(fit.content.exercises[0].exerciseId).toBe('bike');
    expect(fit.changes.every((x) => x.kind === 'swapped' && x.swappedToExerciseId === 'bike')).toBe(true);
    expect(fit.changes[0].note).toBe('Sprint: Sprint is blocked');
    expect(fit.state).toBe('fitted');
  });

  it('(c) an exercise with no pattern is not a fallback for a lift that does not name it: a blocked bench press is dropped, not turned into bike intervals', () => {
    const t = team([{ exerciseId: 'bp', sets: [{ reps: 5, load: { kind: 'kg', value: 60 }, targetRpe: 6 }] }]);
    const ctx = c({ horizontal_push: { mode: 'blocked' } });
    const fit = fitTeamSession(t, ctx);
    expect(fit.content.exercises.flatMap((e) => e.sets)).toEqual([]);
    expect(fit.changes.map((x) => x.kind)).toEqual(['dropped']);
    expect(fit.state).toBe('needs_decision');
    // Named as its "use instead", the same bike is taken.
    const named = { ...ctx, exercises: { ...exs, bp: { ...exs.bp, useInstead: ['bike'] } } };
    expect(fitTeamSession(t, named).content.exercises[0].exerciseId).toBe('bike');
  });

  it('(d) nothing allowed fits: the set is dropped with a note and the session needs a decision', () => {
    const noBike = Object.fromEntries(Object.entries(exs).filter(([id]) => id !== 'bike'));
    const ctx: EngineContext = { ...c({ sprint: { mode: 'blocked' } }), exercises: noBike };
    const t = team([
      { exerciseId: 'spr', sets: [{ reps: 1, load: { kind: 'bodyweight' } }] },
      { exerciseId: 'bp', sets: [{ reps: 5, load: { kind: 'kg', value: 50 }, targetRpe: 6 }] },
    ]);
    const fit = fitTeamSession(t, ctx);
    expect(fit.state).toBe('needs_decision');
    expect(fit.content.exercises.map((e) => e.id)).toEqual(['row1']);
    expect(fit.changes).toEqual([
      {
        kind: 'dropped',
        teamExerciseRowId: 'row0',
        teamSetId: 'row0-set0',
        exerciseId: 'spr',
        before: 'body weight × 1',
        after: null,
        note: 'Sprint: Sprint is blocked',
      },
    ]);
  });

  it('a granted exception plays no part: the waived set is fitted like any other', () => {
    const t = team([{ exerciseId: 'dl', sets: [{ reps: 5, load: { kind: 'kg', value: 100 }, targetRpe: 6 }] }]);
    const ctx = c({ hinge: { mode: 'capped', caps: { maxLoadKg: 80 } } }, {}, { waivedSetIds: new Set(['row0-set0']) });
    expect(fitTeamSession(t, ctx).content.exercises[0].sets[0].load).toEqual({ kind: 'kg', value: 80 });
  });

  it("loads in the athlete's unit: before and after in lb", () => {
    const t = team([{ exerciseId: 'dl', sets: [{ reps: 5, load: { kind: 'kg', value: 100 }, targetRpe: 6 }] }]);
    const fit = fitTeamSession(t, c({ hinge: { mode: 'capped', caps: { maxLoadKg: 80 } } }, {}, { unit: 'lb' }));
    expect(fit.changes[0]).toMatchObject({ before: '220.46 lb × 5 at RPE 6', after: '176.37 lb × 5 at RPE 6' });
  });
});
