import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { checkSets, type EngineSet } from './compliance';
import { ctx, library, plan, stage } from './compliance-fixtures';
import { baselinesArb as baselinesOf, loadArb, plansArb } from './engine-arbitraries';

// The compliance engine as a whole: the same answer in any input order, and a program-sized input (fixtures in compliance-fixtures.ts).
describe('determinism', () => {
  const setsArb = fc
    .array(
      fc.record({
        day: fc.integer({ min: 0, max: 27 }),
        session: fc.constantFrom('a', 'b'),
        exerciseId: fc.constantFrom(...library.map((e) => e.id)),
        reps: fc.integer({ min: 1, max: 15 }),
        load: loadArb,
        targetRpe: fc.option(fc.constantFrom(5, 6, 7, 8, 9, 10), { nil: null }),
      }),
      { maxLength: 40 },
    )
    .map((rows) =>
      rows.map((r, i): EngineSet => {
        const d = new Date(Date.UTC(2026, 2, 2 + r.day)).toISOString().slice(0, 10);
        // Positions are unique within a session, as the server numbers them.
        return {
          id: `set${i}`,
          sessionId: `${d}-${r.session}`,
          date: d,
          exerciseId: r.exerciseId,
          reps: r.reps,
          load: r.load,
          targetRpe: r.targetRpe,
          order: i,
        };
      }),
    );
  const baselinesArb = baselinesOf(library);

  it('the same sets give the same breaches, in any input order (property)', () => {
    fc.assert(
      fc.property(
        setsArb,
        plansArb,
        baselinesArb,
        fc.infiniteStream(fc.double({ min: 0, max: 1, noNaN: true })),
        (sets, plans, baselines, rand) => {
          const c = ctx(plans, baselines, { statusOn: (d) => (d >= '2026-03-23' ? 'out' : 'limited') });
          const first = checkSets(sets, c);
          expect(checkSets(sets, c)).toEqual(first);
          const shuffled = sets
            .map((s) => [rand.next().value, s] as const)
            .sort((a, b) => a[0] - b[0])
            .map(([, s]) => s);
          expect(checkSets(shuffled, c)).toEqual(first);
          expect(checkSets([...sets].reverse(), c)).toEqual(first);
          // Every breach is about a set that was planned, and waived only when told.
          const ids = new Set(sets.map((s) => s.id));
          for (const b of first) {
            expect(ids.has(b.setId)).toBe(true);
            expect(b.waived).toBe(false);
          }
        },
      ),
      { numRuns: 150 },
    );
  });

  it('2,000 sets over 16 weeks against a 4-stage plan are all checked (a size sanity run, no timing)', () => {
    const plans = plan(
      stage({ hinge: { mode: 'blocked' }, jump: { mode: 'capped', caps: { impactAllowed: false } } }, '2026-03-02', '2026-03-29'),
      stage(
        { hinge: { mode: 'capped', caps: { maxPercent1RM: 50, maxSetsPerSession: 3, maxHardSetsPerWeek: 6 } } },
        '2026-03-30',
        '2026-04-26',
      ),
      stage(
        { hinge: { mode: 'capped', caps: { maxPercent1RM: 70, maxRpe: 8 } }, squat: { mode: 'capped', caps: { maxLoadKg: 100 } } },
        '2026-04-27',
        '2026-05-24',
      ),
      stage({ hinge: { mode: 'capped', caps: { maxPercent1RM: 85 } } }, '2026-05-25', '2026-06-21'),
    );
    const ids = library.map((e) => e.id);
    const sets: EngineSet[] = Array.from({ length: 2000 }, (_, i) => {
      const day = i % 112;
      const d = new Date(Date.UTC(2026, 2, 2 + day)).toISOString().slice(0, 10);
      return {
        id: `big${i}`,
        sessionId: `sess-${day}`,
        date: d,
        exerciseId: ids[i % ids.length],
        reps: 3 + (i % 8),
        load: { kind: 'percent', value: 50 + (i % 40) },
        targetRpe: null,
        order: Math.floor(i / 112),
      };
    });
    const bs = checkSets(sets, ctx(plans, Object.fromEntries(ids.map((id) => [id, 150]))));
    expect(bs.length).toBeGreaterThan(0);
    // Each set is checked once: no set is reported twice for the same rule and pattern.
    const keys = bs.map((b) => `${b.setId}|${b.rule}|${b.pattern}`);
    expect(new Set(keys).size).toBe(keys.length);
    // Stage 1 blocks the hinge: every hinge set of those four weeks is blocked, none after.
    const hingeIds = new Set(library.filter((e) => e.patterns.includes('hinge')).map((e) => e.id));
    const firstStageHinge = sets
      .filter((s) => s.date <= '2026-03-29' && hingeIds.has(s.exerciseId))
      .map((s) => s.id)
      .sort();
    expect(
      bs
        .filter((b) => b.rule === 'blocked')
        .map((b) => b.setId)
        .sort(),
    ).toEqual(firstStageHinge);
  });
});
