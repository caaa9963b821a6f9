import type { EntityManager } from 'typeorm';
import { checkSets, weekOf, type Breach } from '../../../policies/load/compliance';
import { ProgramSession, SessionHold } from '../entities';
import type { LimitsChange, RecheckSummary } from '../core/command';
import { engineContext, engineSets } from '../services/programs';
import { athleteCircle, notify } from '../services/notify';
import { memberNames } from '../queries/members';
import { noticeStaleLetters } from '../services/letter-staleness';
import { refitTeamVersions } from '../services/team-fit';
import { humanDate } from '../../../policies/words/dates';

/**
 * The one "limits changed" path. Whatever changes what an athlete may do — a plan, a status, a case
 * opened or closed, a baseline, an exception decision, an exercise's patterns, impact flag or
 * reference lift, a care-team change — ends here, inside the command's transaction:
 *
 * 1. every published session of each affected athlete from the organization's today on is checked
 *    again by the engine (this week's earlier sessions count toward weekly limits, as on publish);
 * 2. sessions that now breach go on hold; held sessions that fit again are released;
 * 3. each of their team-program versions from today on is fitted again: a different fit waits as a
 *    proposal and the version needs the coach's review (services/team-fit.ts);
 * 4. each coach of an athlete with newly held sessions gets one notice for the change.
 *
 * Commands never call this directly: they call `ctx.limitsChanged(change)` (commands/run.ts), which
 * also records that they did, so a command declared as changing limits cannot forget it.
 */
export async function applyLimitsChange(
  m: EntityManager,
  organizationId: string,
  today: string,
  change: LimitsChange,
): Promise<RecheckSummary> {
  const athleteIds =
    'athleteIds' in change ? [...new Set(change.athleteIds)] : await athletesUsingExercise(m, organizationId, change.exerciseId, today);
  const summary: RecheckSummary = { held: [], released: [] };
  const heldByAthlete = new Map<string, ProgramSession[]>();
  for (const athleteId of athleteIds.sort()) {
    const { held, released } = await recheckOne(m, organizationId, athleteId, today);
    if (held.length) {
      summary.held.push({ athleteId, sessionIds: held.map((s) => s.id) });
      heldByAthlete.set(athleteId, held);
    }
    if (released.length) summary.released.push({ athleteId, sessionIds: released });
  }
  await refitTeamVersions(m, organizationId, today, athleteIds);
  if (heldByAthlete.size) await tellCoaches(m, organizationId, heldByAthlete, change.reason);
  await noticeStaleLetters(m, organizationId, today, athleteIds);
  return summary;
}

/** Athletes of the organization with a published session from this week on that uses the exercise. */
async function athletesUsingExercise(m: EntityManager, organizationId: string, exerciseId: string, today: string): Promise<string[]> {
  const rows: { athlete_id: string }[] = await m.query(
    `SELECT DISTINCT a.athlete_id
       FROM program_sessions s
       JOIN programs p ON p.id = s.program_id
       CROSS JOIN LATERAL unnest(p.athlete_ids) AS a(athlete_id)
      WHERE p.organization_id = $1 AND s.status = 'published' AND s.date >= $3
        AND EXISTS (SELECT 1 FROM jsonb_array_elements(s.content->'exercises') e WHERE e->>'exerciseId' = $2)`,
    [organizationId, exerciseId, weekOf(today)],
  );
  return rows.map((r) => r.athlete_id);
}

async function recheckOne(
  m: EntityManager,
  organizationId: string,
  athleteId: string,
  today: string,
): Promise<{ held: ProgramSession[]; released: string[] }> {
  const thisWeek = await m
    .createQueryBuilder(ProgramSession, 's')
    .innerJoin('programs', 'p', 'p.id = s.program_id')
    .where(':athlete = ANY(p.athlete_ids)', { athlete: athleteId })
    .andWhere(`s.status = 'published'`)
    .andWhere('s.date >= :from', { from: weekOf(today) })
    .orderBy('s.date')
    .getMany();
  const sessions = thisWeek.filter((s) => s.date >= today);
  const ctx = await engineContext(m, organizationId, athleteId, thisWeek, 'kg', today);
  const breaches = checkSets(thisWeek.flatMap(engineSets), ctx).filter((b) => !b.waived);
  const bySession = new Map<string, Breach[]>();
  for (const b of breaches) bySession.set(b.sessionId, [...(bySession.get(b.sessionId) ?? []), b]);
  const existing = await m.find(SessionHold, { where: { athleteId } });
  const wasHeld = new Set(existing.map((h) => h.sessionId));
  const held: ProgramSession[] = [];
  const released: string[] = [];
  for (const s of sessions) {
    const list = bySession.get(s.id);
    if (list) {
      await m
        .createQueryBuilder()
        .insert()
        .into(SessionHold)
        .values({ sessionId: s.id, athleteId, organizationId, breaches: list as never })
        .orUpdate(['breaches'], ['session_id', 'athlete_id'])
        .execute();
      if (!wasHeld.has(s.id)) held.push(s);
    } else if (wasHeld.has(s.id)) {
      await m.delete(SessionHold, { sessionId: s.id, athleteId });
      released.push(s.id);
    }
  }
  return { held, released };
}

/** One notice per coach for the change, naming each of their athletes and the held dates. */
async function tellCoaches(
  m: EntityManager,
  organizationId: string,
  heldByAthlete: Map<string, ProgramSession[]>,
  reason: string,
): Promise<void> {
  const nameOf = await memberNames(m, [...heldByAthlete.keys()]);
  const byCoach = new Map<string, string[]>();
  for (const athleteId of heldByAthlete.keys()) {
    const circle = await athleteCircle(m, athleteId);
    for (const coach of circle.coaches) byCoach.set(coach, [...(byCoach.get(coach) ?? []), athleteId]);
  }
  for (const [coach, athletes] of byCoach) {
    const count = athletes.reduce((n, a) => n + heldByAthlete.get(a)!.length, 0);
    const lines = athletes.map(
      (a) =>
        `${nameOf.get(a) ?? 'An athlete'}: ${heldByAthlete
          .get(a)!
          .map((s) => humanDate(s.date))
          .join(', ')}`,
    );
    const who = athletes.length === 1 ? (nameOf.get(athletes[0]) ?? 'An athlete') : `${athletes.length} athletes`;
    await notify(m, [coach], {
      organizationId,
      athleteId: athletes.length === 1 ? athletes[0] : null,
      kind: 'sessions_on_hold',
      severity: 'urgent',
      title: `${who}: ${count} session${count > 1 ? 's' : ''} on hold`,
      body: `${reason} These published sessions now go past a limit and are on hold until you update them: ${lines.join('; ')}.`,
    });
  }
}

/** Interim for call sites not yet turned into commands (they move to `ctx.limitsChanged`). */
export async function recheckAthlete(
  m: EntityManager,
  organizationId: string,
  athleteId: string,
  reason: string,
  today: string,
): Promise<RecheckSummary> {
  return applyLimitsChange(m, organizationId, today, { athleteIds: [athleteId], reason });
}
