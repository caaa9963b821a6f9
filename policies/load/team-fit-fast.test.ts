import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { checkSets, checkSetsToFit, prepareRules, type Breach, type EngineContext } from './compliance';
import { baselinesArb, plansOf } from './engine-arbitraries';
import { sessionEngineSets, type EngineSet } from './sets';
import { fitTeamSession } from './team-fit';
import { exercises, lib, othersArb, teamArb, withoutBike } from './team-fit-arbitraries';
import type { SessionContent } from '../schemas/programs';

// The team fitting's fast paths give exactly the plain path's answers (fast-check over plans, baselines, sessions).

const contextArb = fc
  .record({
    plans: plansOf(2, 9),
    baselines: baselinesArb(lib),
    outLate: fc.boolean(),
    unit: fc.constantFrom('kg' as const, 'lb' as const),
    withBike: fc.boolean(),
  })
  .map(({ plans, baselines, outLate, unit, withBike }): EngineContext => ({
    plans,
    exercises: withBike ? exercises : withoutBike,
    baselines,
    unit,
    statusOn: (d) => (outLate && d >= '2026-03-23' ? 'out' : 'limited'),
  }));

/** What the lean check leaves out: the words of a breach that names a pattern. */
const withoutWords = (b: Breach): Breach => (b.pattern === null ? b : { ...b, planned: '', fits: null, message: '' });

/** A session's own ids, so several sessions of one athlete never share a row or set id. */
const own = (k: number, content: SessionContent): SessionContent => ({
  exercises: content.exercises.map((r) => ({ ...r, id: `s${k}-${r.id}`, sets: r.sets.map((s) => ({ ...s, id: `s${k}-${s.id}` })) })),
});

describe('team fitting, fast paths (properties)', () => {
  it("the fitting's lean check finds the same breaches as checkSets, in the same order, only without the words of pattern breaches", () => {
    fc.assert(
      fc.property(teamArb, contextArb, othersArb, (team, ctx, rows) => {
        const others: EngineSet[] = rows.map((r, i) => ({
          id: `other${i}`,
          sessionId: `other-${r.day}`,
          date: new Date(Date.UTC(2026, 2, 2 + r.day)).toISOString().slice(0, 10),
          exerciseId: r.exerciseId,
          reps: 5,
          load: { kind: 'kg', value: 20 },
          targetRpe: r.rpe,
          order: i,
        }));
        const sets = [...others, ...sessionEngineSets(team)];
        expect(checkSetsToFit(sets, ctx)).toEqual(checkSets(sets, ctx).map(withoutWords));
        expect(checkSetsToFit(sets, ctx, prepareRules(ctx))).toEqual(checkSets(sets, ctx).map(withoutWords));
      }),
      { numRuns: 200 },
    );
  });

  it('a squad-style fitting (rules and resolved loads kept, other versions as sessions and only those that can count, untouched rows kept as written, only changed sets checked again) gives exactly the plain fitting', () => {
    fc.assert(
      fc.property(contextArb, fc.array(teamArb, { minLength: 1, maxLength: 5 }), (ctx, teams) => {
        const sessions = teams
          .map((t, k) => ({ id: `s${k}`, date: t.date, content: own(k, t.content) }))
          .sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : 0));
        const rules = prepareRules(ctx);
        const versions: { id: string; date: string; content: SessionContent }[] = [];
        for (const team of sessions) {
          const fast = fitTeamSession(team, ctx, { otherSessions: versions, rules });
          const plain = fitTeamSession(team, ctx, { otherSets: versions.flatMap(sessionEngineSets), recheckEverySet: true });
          expect(fast).toEqual(plain);
          versions.push({ id: team.id, date: team.date, content: fast.content });
        }
      }),
      { numRuns: 150 },
    );
  });
});
