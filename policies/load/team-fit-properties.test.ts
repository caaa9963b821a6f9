import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { blockingBreaches, checkSets, type EngineContext } from './compliance';
import { baselinesArb, plansOf } from './engine-arbitraries';
import { sessionEngineSets, type EngineSet } from './sets';
import { fitTeamSession } from './team-fit';
import { exercises, lib, othersArb, teamArb, uuid, withoutBike } from './team-fit-arbitraries';
import { SessionContentSchema, type SessionContent } from '../schemas/programs';

// Every fitted session passes the engine, and fitting is idempotent (fast-check over plans, baselines, team sessions).
/** The fixtures' exercise ids are short words; the stored content names uuids. */
const stored = (c: SessionContent): SessionContent => ({
  exercises: c.exercises.map((r) => ({ ...r, exerciseId: uuid(500_000 + lib.findIndex((e) => e.id === r.exerciseId)) })),
});

describe('fitTeamSession (properties)', () => {
  it('every fitted session passes the engine, keeps the team ids, is valid content, and fitting it again changes nothing', () => {
    fc.assert(
      fc.property(
        teamArb,
        plansOf(2, 9),
        baselinesArb(lib),
        othersArb,
        fc.boolean(),
        fc.constantFrom('kg' as const, 'lb' as const),
        fc.boolean(),
        (team, plans, baselines, rows, outLate, unit, withBike) => {
          const ctx: EngineContext = {
            plans,
            exercises: withBike ? exercises : withoutBike,
            baselines,
            unit,
            statusOn: (d) => (outLate && d >= '2026-03-23' ? 'out' : 'limited'),
          };
          const otherSets: EngineSet[] = rows.map((r, i) => ({
            id: `other${i}`,
            sessionId: `other-${r.day}`,
            date: new Date(Date.UTC(2026, 2, 2 + r.day)).toISOString().slice(0, 10),
            exerciseId: r.exerciseId,
            reps: 5,
            load: { kind: 'kg', value: 20 },
            targetRpe: r.rpe,
            order: i,
          }));
          const fit = fitTeamSession(team, ctx, { otherSets });
          const sets = sessionEngineSets({ ...team, content: fit.content });
          const ids = new Set(sets.map((s) => s.id));
          expect(blockingBreaches(checkSets([...sets, ...otherSets], ctx)).filter((b) => ids.has(b.setId))).toEqual([]);
          // What the server stores: valid session content, with the team's own row and set ids.
          expect(SessionContentSchema.safeParse(stored(fit.content)).error).toBeUndefined();
          const teamRows = new Set(team.content.exercises.map((r) => r.id));
          const teamSets = new Set(team.content.exercises.flatMap((r) => r.sets.map((s) => s.id)));
          for (const r of fit.content.exercises) {
            expect(teamRows.has(r.id)).toBe(true);
            for (const s of r.sets) expect(teamSets.has(s.id)).toBe(true);
          }
          // The state says what the changes say.
          if (fit.state !== 'out')
            expect(fit.state).toBe(
              fit.changes.some((c) => c.kind === 'dropped') ? 'needs_decision' : fit.changes.length ? 'fitted' : 'as_written',
            );
          // Idempotent: the fitted version, fitted again, is as written.
          if (fit.state !== 'out') {
            const again = fitTeamSession({ ...team, content: fit.content }, ctx, { otherSets });
            expect(again).toEqual({ content: fit.content, changes: [], state: 'as_written' });
          }
        },
      ),
      { numRuns: 300 },
    );
  });

  it('an athlete without plans gets the team session unchanged apart from % resolution (property)', () => {
    fc.assert(
      fc.property(teamArb, baselinesArb(lib), (team, baselines) => {
        const fit = fitTeamSession(team, { plans: [], exercises, baselines });
        expect(fit.state).toBe('as_written');
        expect(fit.changes).toEqual([]);
        const resolvedOrPercent = (c: SessionContent) =>
          c.exercises.map((r) => ({ ...r, sets: r.sets.map((s) => ({ ...s, load: 'resolved' })) }));
        // Sets that were a % are either still that % (no 1RM) or a load; every other set is as written.
        const fitted = fit.content.exercises.flatMap((r) => r.sets);
        team.content.exercises
          .flatMap((r) => r.sets)
          .forEach((s, i) => {
            if (s.load.kind !== 'percent') expect(fitted[i]).toEqual(s);
            else expect({ ...fitted[i], load: null }).toEqual({ ...s, load: null });
          });
        expect(resolvedOrPercent(fit.content)).toEqual(resolvedOrPercent(team.content));
      }),
      { numRuns: 200 },
    );
  });
});
