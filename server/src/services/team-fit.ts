import { createHash } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { blockingBreaches } from '../../../policies/load/compliance';
import type { FittedSession } from '../../../policies/load/team-fit-types';
import type { Unit } from '../../../policies/schemas/common';
import type { SessionContent } from '../../../policies/schemas/programs';
import { Program, ProgramSession } from '../entities';
import { breachesFor, engineContext, publishedInWeeks } from './programs';
import { fitTeamSession } from '../../../policies/load/team-fit';

/**
 * Each athlete's version of a team session: an ordinary session of the athlete's own program
 * (programs.team_program_id), fitted to the athlete's limits on its date. The team session is the
 * source; a version the coach edited by hand (`overridden`) is never rewritten from it, only marked
 * for review.
 */

/** The group's athletes whose membership is active (a deactivated member trains nothing). */
export async function groupAthletes(m: EntityManager, groupId: string): Promise<string[]> {
  const rows: { member_id: string }[] = await m.query(
    `SELECT gm.member_id FROM group_members gm JOIN memberships ms ON ms.id = gm.member_id AND ms.active
      WHERE gm.group_id = $1 AND gm.role = 'athlete' ORDER BY gm.member_id`,
    [groupId],
  );
  return rows.map((r) => r.member_id);
}

/**
 * An id of the athlete's version derived from the team session's row or set id: the same on every
 * re-fit, so an exception granted on a version's set still covers it while the set stays as granted,
 * and no two athletes share a set id.
 */
export function athleteRowId(athleteId: string, teamId: string): string {
  const h = createHash('sha256').update(`${athleteId}:${teamId}`).digest('hex');
  // Laid out as an RFC 9562 name-based (version 5 style) UUID so the content schema accepts it.
  const variant = ((parseInt(h[16], 16) & 0x3) | 0x8).toString(16);
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-5${h.slice(13, 16)}-${variant}${h.slice(17, 20)}-${h.slice(20, 32)}`;
}

export function withAthleteIds(content: SessionContent, athleteId: string): SessionContent {
  return {
    exercises: content.exercises.map((row) => ({
      ...row,
      id: athleteRowId(athleteId, row.id),
      sets: row.sets.map((s) => ({ ...s, id: athleteRowId(athleteId, s.id) })),
    })),
  };
}

/** The same content whatever the order its keys were written in. */
export function sameContent(a: unknown, b: unknown): boolean {
  const canon = (v: unknown): unknown =>
    Array.isArray(v)
      ? v.map(canon)
      : v && typeof v === 'object'
        ? Object.fromEntries(
            Object.entries(v as Record<string, unknown>)
              .filter(([, x]) => x !== undefined)
              .sort(([x], [y]) => x.localeCompare(y))
              .map(([k, x]) => [k, canon(x)]),
          )
        : v;
  return JSON.stringify(canon(a)) === JSON.stringify(canon(b));
}

/** The athlete's own program of versions of this team program, made on first need. */
export async function ensureAthleteProgram(m: EntityManager, team: Program, athleteId: string): Promise<Program> {
  const found = await m
    .createQueryBuilder(Program, 'p')
    .where('p.team_program_id = :t AND p.athlete_ids = ARRAY[CAST(:a AS uuid)]', { t: team.id, a: athleteId })
    .getOne();
  if (found) {
    if (found.name !== team.name) await m.update(Program, { id: found.id }, { name: team.name });
    return found;
  }
  return m.save(
    m.create(Program, {
      organizationId: team.organizationId,
      name: team.name,
      athleteIds: [athleteId],
      teamProgramId: team.id,
      createdBy: team.createdBy,
    }),
  );
}

/** The athlete's version of a team session, if there is one. */
export async function versionOf(m: EntityManager, teamSessionId: string, athleteId: string): Promise<ProgramSession | null> {
  return m
    .createQueryBuilder(ProgramSession, 's')
    .innerJoin('programs', 'p', 'p.id = s.program_id')
    .where('s.team_session_id = :t AND :a = ANY(p.athlete_ids)', { t: teamSessionId, a: athleteId })
    .getOne();
}

/**
 * The team session fitted to one athlete on its date, with the athlete's ids: their other published
 * sessions of the same weeks count toward weekly limits, as on publish.
 */
export async function fitFor(
  m: EntityManager,
  organizationId: string,
  team: Pick<ProgramSession, 'id' | 'date' | 'content'>,
  athleteId: string,
  version: Pick<ProgramSession, 'id' | 'date' | 'content'> | null,
  unit: Unit,
  today: string,
): Promise<FittedSession> {
  const others = await publishedInWeeks(m, athleteId, [team.date], version ? [version.id, team.id] : [team.id]);
  // Fitted on the team's ids (the changes name the team's rows and sets), then given the athlete's own.
  const probe = { id: version?.id ?? team.id, date: team.date, content: team.content };
  const ctx = await engineContext(m, organizationId, athleteId, [...(version ? [version] : []), ...others], unit, today);
  // Passed as sessions: the fitting turns them into engine sets only when a weekly limit is in force,
  // and then only the sets that can change a count the session reads (otherSetsOf) — the same answer.
  const fitted = fitTeamSession(probe, ctx, { otherSessions: others });
  return { ...fitted, content: withAthleteIds(fitted.content, athleteId) };
}

export interface FitOutcome {
  athleteId: string;
  version: ProgramSession;
  /** The version's content or date was rewritten (a published one must still pass the engine). */
  rewritten: boolean;
}

/**
 * Fits (or re-fits) one athlete's version from the team session. A hand-edited version is kept and
 * marked "needs review" (the team session changed since the edit) unless `force` (a reset).
 */
export async function fitOneVersion(
  m: EntityManager,
  team: ProgramSession,
  teamProgram: Program,
  athleteId: string,
  unit: Unit,
  today: string,
  force = false,
): Promise<FitOutcome> {
  const existing = await versionOf(m, team.id, athleteId);
  if (existing?.overridden && !force) {
    await m.update(ProgramSession, { id: existing.id }, { needsReview: true, version: () => 'version + 1' } as never);
    return { athleteId, version: await m.findOneByOrFail(ProgramSession, { id: existing.id }), rewritten: false };
  }
  const fitted = await fitFor(m, team.organizationId, team, athleteId, existing, unit, today);
  const fields = {
    date: team.date,
    title: team.title,
    content: fitted.content,
    fitState: fitted.state,
    fitChanges: fitted.changes,
    overridden: false,
    needsReview: false,
    proposal: null,
    reviewedAt: null as Date | null,
  };
  if (!existing) {
    const program = await ensureAthleteProgram(m, teamProgram, athleteId);
    const saved = await m.save(
      m.create(ProgramSession, {
        ...fields,
        organizationId: team.organizationId,
        programId: program.id,
        teamSessionId: team.id,
        status: 'draft',
      }),
    );
    return { athleteId, version: saved, rewritten: true };
  }
  const rewritten = existing.date !== team.date || !sameContent(existing.content, fitted.content);
  const sameFit =
    !force &&
    !rewritten &&
    existing.fitState === fitted.state &&
    sameContent(existing.fitChanges, fitted.changes) &&
    !existing.needsReview &&
    !existing.proposal &&
    !existing.overridden;
  const unchanged = sameFit && existing.title === team.title;
  // A coach's acceptance (say of a drop) stands while the fit is the same (a new title alone keeps it); a reset clears it.
  if (sameFit) fields.reviewedAt = existing.reviewedAt;
  if (!unchanged)
    await m
      .createQueryBuilder()
      .update(ProgramSession)
      .set({
        ...fields,
        content: fields.content as never,
        fitChanges: fields.fitChanges as never,
        version: () => 'version + 1',
        updatedAt: () => 'now()',
      })
      .where('id = :id', { id: existing.id })
      .execute();
  return { athleteId, version: await m.findOneByOrFail(ProgramSession, { id: existing.id }), rewritten };
}

/** Fits every active athlete of the team program's group to one team session (on create and on edit). */
export async function fitVersions(
  m: EntityManager,
  organizationId: string,
  teamSessionId: string,
  today: string,
  unit: Unit,
): Promise<FitOutcome[]> {
  const team = await m.findOneByOrFail(ProgramSession, { id: teamSessionId, organizationId });
  const teamProgram = await m.findOneByOrFail(Program, { id: team.programId, organizationId });
  const out: FitOutcome[] = [];
  // One athlete after another: each fit reads on the transaction's single connection.
  for (const athleteId of await groupAthletes(m, teamProgram.groupId!))
    out.push(await fitOneVersion(m, team, teamProgram, athleteId, unit, today));
  return out;
}

/**
 * After a limit changed for these athletes: each of their versions from today on is fitted again. A
 * result other than the version as it stands waits as a proposal, and the version needs review; a hand
 * edit gets a proposal only when the engine no longer passes it. The existing path still puts a
 * published version that now breaches on hold (commands/limits.ts).
 */
export async function refitTeamVersions(m: EntityManager, organizationId: string, today: string, athleteIds: string[]): Promise<void> {
  if (athleteIds.length === 0) return;
  const rows: { id: string; team_session_id: string; athlete_id: string }[] = await m.query(
    `SELECT s.id, s.team_session_id, p.athlete_ids[1] AS athlete_id FROM program_sessions s
       JOIN programs p ON p.id = s.program_id AND p.team_program_id IS NOT NULL
      WHERE s.organization_id = $1 AND s.team_session_id IS NOT NULL AND s.date >= $2 AND p.athlete_ids[1] = ANY($3)
      ORDER BY p.athlete_ids[1], s.date, s.id`,
    [organizationId, today, athleteIds],
  );
  for (const r of rows) {
    const version = await m.findOneByOrFail(ProgramSession, { id: r.id });
    const team = await m.findOneByOrFail(ProgramSession, { id: r.team_session_id });
    const fitted = await fitFor(m, organizationId, team, r.athlete_id, version, 'kg', today);
    const current: FittedSession = { content: version.content, changes: version.fitChanges, state: version.fitState ?? 'as_written' };
    const differs = !sameContent(current.content, fitted.content);
    const stillFits = version.overridden ? await handEditPasses(m, organizationId, r.athlete_id, version, today) : !differs;
    if (stillFits || !differs) continue;
    await m
      .createQueryBuilder()
      .update(ProgramSession)
      .set({ proposal: fitted as never, needsReview: true, reviewedAt: null, version: () => 'version + 1' })
      .where('id = :id', { id: version.id })
      .execute();
  }
}

async function handEditPasses(m: EntityManager, organizationId: string, athleteId: string, version: ProgramSession, today: string) {
  return blockingBreaches(await breachesFor(m, organizationId, athleteId, [version], 'kg', today)).length === 0;
}

/**
 * Athletes who left the group lose their versions dated today or later that nothing was logged
 * against; what they trained stays part of their history.
 */
export async function removeVersions(m: EntityManager, groupId: string, athleteIds: string[], today: string): Promise<void> {
  if (athleteIds.length === 0) return;
  await m.query(
    `DELETE FROM program_sessions s USING programs p, programs t
      WHERE p.id = s.program_id AND t.id = p.team_program_id AND t.group_id = $1 AND p.athlete_ids[1] = ANY($2)
        AND s.team_session_id IS NOT NULL AND s.date >= $3
        AND NOT EXISTS (SELECT 1 FROM training_logs l WHERE l.session_id = s.id)`,
    [groupId, athleteIds, today],
  );
}
