import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { checkSets, prepareRules, type EngineContext, type EngineSet } from './compliance';
import { exercises, library, set } from './compliance-fixtures';
import { baselinesArb, loadArb, ruleArb } from './engine-arbitraries';
import type { PlanInput, PlanStage } from './in-force';
import { MOVEMENT_PATTERNS } from './patterns';
import { fitTeamSession } from './team-fit';
import type { SessionContent } from '../schemas/programs';

// The rules prepared once per athlete and reused across checks (PreparedRules) give exactly the
// answers of the plain path, which works everything out afresh for each check (fast-check).

const dayIso = (day: number) => new Date(Date.UTC(2026, 2, 2 + day)).toISOString().slice(0, 10);
/** Mostly calendar days of four weeks from Monday 2 March 2026; now and then a date that is not one. */
const dateArb = fc.oneof(
  { weight: 12, arbitrary: fc.integer({ min: 0, max: 27 }).map(dayIso) },
  { weight: 1, arbitrary: fc.constantFrom('2026-02-30', '2026-3-05', 'not a date') },
);

/** One plan: up to three stages that do not overlap, each with rules for up to four patterns. */
const planArb = (k: number) =>
  fc
    .array(
      fc.record({
        gap: fc.integer({ min: 0, max: 4 }),
        length: fc.integer({ min: 0, max: 9 }),
        rules: fc.array(fc.tuple(fc.constantFrom(...MOVEMENT_PATTERNS), ruleArb), { maxLength: 4 }),
      }),
      { maxLength: 3 },
    )
    .map((parts): PlanInput => {
      let day = 0;
      const stages: PlanStage[] = parts.map((p, i) => {
        const start = day + p.gap;
        day = start + p.length + 1;
        return {
          id: `p${k}s${i}`,
          startDate: dayIso(start),
          endDate: dayIso(start + p.length),
          painCeiling: 4,
          patterns: Object.fromEntries(p.rules),
        };
      });
      return { planId: `p${k}`, caseId: `c${k}`, version: 1, stages };
    });
const plansArb = fc.array(fc.nat(), { maxLength: 2 }).chain((ks) => fc.tuple(...ks.map((_, i) => planArb(i))));

const setsArb = fc.array(
  fc.record({
    date: dateArb,
    session: fc.constantFrom('a', 'b'),
    exerciseId: fc.constantFrom(...library.map((e) => e.id), 'unknown'),
    reps: fc.oneof(fc.integer({ min: 1, max: 15 }), fc.constant(0)),
    load: loadArb,
    targetRpe: fc.option(fc.constantFrom(5, 6, 7, 8, 9, 10), { nil: null }),
    warmUp: fc.boolean(),
  }),
  { maxLength: 30 },
);
/** Several checks of one athlete, as the team fitting makes them: each a handful of sets. */
const checksArb = fc.array(setsArb, { minLength: 1, maxLength: 6 });

type SetRow = {
  date: string;
  session: string;
  exerciseId: string;
  reps: number;
  load: EngineSet['load'];
  targetRpe: number | null;
  warmUp: boolean;
};
const toSets = (rows: SetRow[], call: number): EngineSet[] =>
  rows.map((r, i) => set({ id: `c${call}s${i}`, sessionId: `${r.date}-${r.session}`, order: i, ...r }));

const contextArb = fc.record({
  plans: plansArb,
  baselines: baselinesArb(library),
  outFrom: fc.option(fc.integer({ min: 0, max: 27 }), { nil: null }),
  unit: fc.constantFrom('kg' as const, 'lb' as const),
  waived: fc.boolean(),
});
const contextOf = (c: {
  plans: PlanInput[];
  baselines: Record<string, number>;
  outFrom: number | null;
  unit: 'kg' | 'lb';
  waived: boolean;
}): EngineContext => ({
  plans: c.plans,
  exercises,
  baselines: c.baselines,
  unit: c.unit,
  statusOn: (d) => (c.outFrom !== null && d >= dayIso(c.outFrom) ? 'out' : 'limited'),
  ...(c.waived ? { waivedSetIds: new Set(['c0s0', 'c1s1']) } : {}),
});

describe('PreparedRules', () => {
  it('checks with the rules prepared once give exactly the breaches of the plain check, call after call (property)', () => {
    fc.assert(
      fc.property(contextArb, checksArb, (c, checks) => {
        const ctx = contextOf(c);
        const prepared = prepareRules(ctx);
        checks.forEach((rows, call) => {
          const sets = toSets(rows, call);
          expect(checkSets(sets, ctx, prepared)).toEqual(checkSets(sets, ctx));
        });
      }),
      { numRuns: 400 },
    );
  });

  it('rules prepared for other plans, library or status are not used: the check works them out afresh', () => {
    const ctx: EngineContext = { plans: [], exercises, baselines: {} };
    const blocked: EngineContext = {
      ...ctx,
      plans: [
        {
          planId: 'p',
          caseId: 'c',
          version: 1,
          stages: [{ id: 's', startDate: '2026-03-02', endDate: '2026-03-08', painCeiling: 4, patterns: { hinge: { mode: 'blocked' } } }],
        },
      ],
    };
    const sets = [set({})];
    const stale = prepareRules(ctx);
    expect(checkSets(sets, ctx, stale)).toEqual([]);
    expect(checkSets(sets, blocked, stale).map((b) => b.rule)).toEqual(['blocked']);
    expect(checkSets(sets, { ...ctx, statusOn: () => 'out' }, stale).map((b) => b.rule)).toEqual(['status_out']);
  });

  it('a squad-style fitting with one PreparedRules per athlete gives the same versions as fitting each session afresh (property)', () => {
    const sessionArb = fc.record({
      date: dateArb,
      rows: fc.array(
        fc.record({
          exerciseId: fc.constantFrom(...library.map((e) => e.id)),
          sets: fc.array(
            fc.record({
              reps: fc.integer({ min: 1, max: 12 }),
              load: loadArb,
              targetRpe: fc.option(fc.constantFrom(6, 7, 8, 9), { nil: null }),
            }),
            {
              minLength: 1,
              maxLength: 4,
            },
          ),
        }),
        { maxLength: 4 },
      ),
    });
    fc.assert(
      fc.property(contextArb, fc.array(sessionArb, { minLength: 1, maxLength: 6 }), (c, sessions) => {
        const ctx = contextOf(c);
        const rules = prepareRules(ctx);
        const otherSets: EngineSet[] = [];
        sessions.forEach((s, k) => {
          const content: SessionContent = {
            exercises: s.rows.map((r, i) => ({
              id: `t${k}r${i}`,
              exerciseId: r.exerciseId,
              sets: r.sets.map((x, j) => ({ id: `t${k}r${i}s${j}`, ...x })),
            })),
          };
          const team = { id: `t${k}`, date: s.date, content };
          const fitted = fitTeamSession(team, ctx, { otherSets, rules });
          expect(fitted).toEqual(fitTeamSession(team, ctx, { otherSets }));
          fitted.content.exercises.forEach((r) =>
            r.sets.forEach((x, order) =>
              otherSets.push({
                ...x,
                sessionId: team.id,
                date: team.date,
                exerciseId: r.exerciseId,
                order,
                targetRpe: x.targetRpe ?? null,
              }),
            ),
          );
        });
      }),
      { numRuns: 200 },
    );
  });
});
