/**
 * Checked after every step, on the database read directly (plain SQL):
 * 1. the database holds what the model sent and the app accepted (sessions, plans, statuses, cases,
 *    exercises, baselines, exceptions), so a write that silently changes data is caught at once;
 * 2. the guarantee: no published, non-held, non-waived set (from the organization's today on)
 *    breaches the limits in force on its date, and every held session from today on really breaches;
 *    no session that is not published is held.
 */
import { breaches, waivedSets } from './checker';
import { athleteLabel, localTime, mondayOf, todayOf, type BlockM, type Model, type SessionView } from './model';
import type { Real } from './world';
import { count } from './stats';

interface SessionRow {
  id: string;
  program_id: string;
  date: string;
  status: 'draft' | 'published';
  content: { exercises: { id: string; exerciseId: string; sets: BlockM['sets'] }[] };
}

const blocksOf = (row: SessionRow): BlockM[] =>
  row.content.exercises.map((e) => ({
    id: e.id,
    exerciseId: e.exerciseId,
    sets: e.sets.map((s) => ({ id: s.id, reps: s.reps, load: s.load, targetRpe: s.targetRpe })),
  }));

function fail(m: Model, what: string): never {
  throw new Error(`${what}\n  at ${localTime(m)} (${m.zone}), after:\n    ${m.log.join('\n    ')}`);
}

/** JSON with object keys sorted (jsonb stores keys in its own order). */
const canon = (v: unknown): string =>
  JSON.stringify(v, (_k, x: unknown) =>
    x && typeof x === 'object' && !Array.isArray(x) ? Object.fromEntries(Object.entries(x).sort(([a], [b]) => (a < b ? -1 : 1))) : x,
  );

function same(m: Model, what: string, actual: unknown, expected: unknown): void {
  const a = canon(actual);
  const e = canon(expected);
  if (a !== e) fail(m, `the database differs from what was sent: ${what}\n  database: ${a}\n  sent:     ${e}`);
}

async function storedAsSent(m: Model, r: Real, sessions: SessionRow[]): Promise<void> {
  const db = r.h.ds;
  const org = r.org.id;
  for (const s of m.sessions) {
    const row = sessions.find((x) => x.id === s.id);
    same(m, `session ${s.label}`, row && [row.date, row.status, blocksOf(row)], [s.date, s.published ? 'published' : 'draft', s.blocks]);
  }
  const exercises: { id: string; patterns: string[]; ballistic: boolean; reference_id: string | null; archived: boolean }[] =
    await db.query(`SELECT id, patterns, ballistic, reference_id, archived FROM exercises WHERE id = ANY($1)`, [
      m.exercises.map((e) => e.id),
    ]);
  for (const e of m.exercises) {
    const row = exercises.find((x) => x.id === e.id)!;
    same(
      m,
      `exercise ${e.name}`,
      [row.patterns, row.ballistic, row.reference_id, row.archived],
      [e.patterns, e.ballistic, e.referenceId, e.archived],
    );
  }
  const cases: { id: string; closed: boolean; stages: { id: string; startDate: string; endDate: string; patterns: object }[] | null }[] =
    await db.query(
      `SELECT c.id, c.closed_on IS NOT NULL AS closed, v.stages FROM cases c
         LEFT JOIN restriction_plans p ON p.case_id = c.id
         LEFT JOIN restriction_plan_versions v ON v.plan_id = p.id AND v.version = p.version
        WHERE c.organization_id = $1`,
      [org],
    );
  const statuses: { case_id: string; status: string; from: string }[] = await db.query(
    `SELECT case_id, status, effective_from::text AS from FROM participation_status_changes WHERE organization_id = $1 ORDER BY created_at`,
    [org],
  );
  for (const c of m.cases) {
    const row = cases.find((x) => x.id === c.id);
    const stages = row?.stages?.map((s) => ({ id: s.id, startDate: s.startDate, endDate: s.endDate, patterns: s.patterns })) ?? null;
    same(m, `case ${c.label}`, row && [row.closed, stages], [c.closed, c.plan?.stages ?? null]);
    same(
      m,
      `statuses of case ${c.label}`,
      statuses.filter((s) => s.case_id === c.id).map((s) => [s.status, s.from]),
      c.statuses.map((s) => [s.status, s.from]),
    );
  }
  const baselines: { athlete_id: string; exercise_id: string; e1rm_kg: string; tested_on: string }[] = await db.query(
    `SELECT athlete_id, exercise_id, e1rm_kg, tested_on::text FROM baselines WHERE organization_id = $1 ORDER BY created_at`,
    [org],
  );
  same(
    m,
    'baselines',
    baselines.map((b) => [b.athlete_id, b.exercise_id, Number(b.e1rm_kg), b.tested_on]),
    m.baselines.map((b) => [b.athleteId, b.exerciseId, b.e1rmKg, b.testedOn]),
  );
  const exceptions: { id: string; status: string; granted_set_ids: string[] }[] = await db.query(
    `SELECT id, status, granted_set_ids FROM program_exceptions WHERE organization_id = $1 ORDER BY created_at`,
    [org],
  );
  same(
    m,
    'exceptions',
    exceptions.map((x) => [x.id, x.status, [...x.granted_set_ids].sort()]),
    m.exceptions.map((x) => [x.id, x.status, [...x.grantedSetIds].sort()]),
  );
}

export async function assertInvariant(m: Model, r: Real): Promise<void> {
  const today = todayOf(m);
  const sessions: SessionRow[] = await r.h.ds.query(
    `SELECT id, program_id, date::text AS date, status, content FROM program_sessions WHERE organization_id = $1`,
    [r.org.id],
  );
  await storedAsSent(m, r, sessions);
  const holds: { session_id: string; athlete_id: string }[] = await r.h.ds.query(
    `SELECT session_id, athlete_id FROM session_holds WHERE organization_id = $1`,
    [r.org.id],
  );
  const label = (id: string) => m.sessions.find((s) => s.id === id)?.label ?? id;
  for (const hold of holds) {
    const s = sessions.find((x) => x.id === hold.session_id);
    if (s?.status !== 'published') fail(m, `session ${label(hold.session_id)} is held but not published (${s?.status})`);
  }
  for (const athleteId of m.athletes) {
    const mine = m.programs.filter((p) => p.athleteIds.includes(athleteId)).map((p) => p.id);
    // This week's earlier sessions count toward the weekly limits of today's and later ones.
    const published: SessionView[] = sessions
      .filter((s) => s.status === 'published' && mine.includes(s.program_id) && s.date >= mondayOf(today))
      .map((s) => ({ id: s.id, date: s.date, blocks: blocksOf(s) }));
    const found = breaches(m, athleteId, published);
    for (const s of published.filter((x) => x.date >= today)) {
      const waived = waivedSets(m, athleteId, s);
      const real = found.filter((b) => b.sessionId === s.id && !waived.has(b.setId));
      const held = holds.some((h) => h.session_id === s.id && h.athlete_id === athleteId);
      const who = `athlete ${athleteLabel(m, athleteId)}`;
      if (!held && real.length)
        fail(
          m,
          `session ${label(s.id)} on ${s.date} is published and not held for ${who}, but breaches: ${real.map((b) => b.rule).join('; ')}`,
        );
      if (held) count('(a session held for an athlete, seen after a step)');
      if (held && !real.length) fail(m, `session ${label(s.id)} on ${s.date} is held for ${who}, but breaches nothing`);
    }
  }
}
