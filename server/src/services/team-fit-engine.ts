import { checkSets, type EngineContext, type EngineSet } from '../../../policies/load/compliance';
import { sessionEngineSets } from '../../../policies/load/sets';
import type { FitChange, FittedSession } from '../../../policies/load/team-fit-types';
import type { SessionContent } from '../../../policies/schemas/programs';

/**
 * Interim stand-in for the pure fitting (policies/load/team-fit.ts, branch wt-fit), with its
 * signature: it keeps the session as written where it fits, lowers a load to the engine's fitting load
 * where one exists, and otherwise drops the set (a decision for the coach). Replaced by a re-export of
 * the real function when that branch is merged.
 */
export function fitTeamSession(
  team: { id: string; date: string; content: SessionContent },
  ctx: EngineContext,
  opts: { otherSets: EngineSet[] },
): FittedSession {
  if (ctx.statusOn?.(team.date) === 'out') return { content: { exercises: [] }, changes: [], state: 'out' };
  const changes: FitChange[] = [];
  let content: SessionContent = structuredClone(team.content);
  for (let pass = 0; pass < 3; pass++) {
    const breaches = checkSets([...opts.otherSets, ...sessionEngineSets({ ...team, content })], ctx).filter(
      (b) => b.sessionId === team.id && !b.waived,
    );
    if (breaches.length === 0) break;
    const bySet = new Map(breaches.map((b) => [b.setId, b]));
    content = {
      exercises: content.exercises
        .map((row) => ({
          ...row,
          sets: row.sets.flatMap((set) => {
            const b = bySet.get(set.id);
            if (!b) return [set];
            if (b.fittingKg !== null && b.fittingKg > 0 && pass < 2) {
              changes.push({
                kind: 'load_lowered',
                teamExerciseRowId: row.id,
                teamSetId: set.id,
                exerciseId: row.exerciseId,
                before: b.planned,
                after: `${b.fittingKg} kg`,
                note: b.limit,
              });
              return [{ ...set, load: { kind: 'kg' as const, value: b.fittingKg } }];
            }
            changes.push({
              kind: 'dropped',
              teamExerciseRowId: row.id,
              teamSetId: set.id,
              exerciseId: row.exerciseId,
              before: b.planned,
              after: null,
              note: b.message,
            });
            return [];
          }),
        }))
        .filter((row) => row.sets.length > 0),
    };
  }
  const state = changes.some((c) => c.kind === 'dropped') ? 'needs_decision' : changes.length ? 'fitted' : 'as_written';
  return { content, changes, state };
}
