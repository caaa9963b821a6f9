import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { RED_FLAG_ITEMS } from '../../../../policies/red-flags';
import { todayIso } from '../../../../policies/roles';
import { CareTeamAssignment, GuardianLink, Membership, Organization } from '../../entities';
import { signedIn, useHarness, type Client } from '../../test/harness';
import { createMember, createOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../../test/factories';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

type Who = 'admin' | 'coach' | 'clinician' | 'clinician2' | 'athlete' | 'guardian' | 'otherCoach' | 'otherClinician';

/** A local number unlike the factory's default '911', so the message provably uses the organization's own. */
const EMERGENCY_NUMBER = '112';

interface World {
  org: TestOrg & { clinician2: MemberRef; inactiveClinician: MemberRef };
  base: string;
  as: (who: Who) => Promise<Client>;
}

/**
 * One organization for the file (sign-ins cost a bcrypt comparison each): the factory's care team plus
 * a second clinician and a deactivated clinician on it, and a second care team (otherCoach +
 * otherClinician around otherAthlete), so "same role, other care team" has athletes of its own.
 */
async function makeWorld(): Promise<World> {
  const base = await createOrg(h.ds);
  await h.ds.getRepository(Organization).update({ id: base.id }, { emergencyNumber: EMERGENCY_NUMBER });
  const [clinician2, inactiveClinician] = await Promise.all([
    createMember(h.ds, base.id, ['clinician']),
    createMember(h.ds, base.id, ['clinician']),
  ]);
  await h.ds.getRepository(Membership).update({ id: inactiveClinician.membershipId }, { active: false });
  await h.ds.getRepository(CareTeamAssignment).save([
    { organizationId: base.id, athleteId: base.athlete.membershipId, memberId: clinician2.membershipId, role: 'clinician' },
    { organizationId: base.id, athleteId: base.otherAthlete.membershipId, memberId: base.otherClinician.membershipId, role: 'clinician' },
    { organizationId: base.id, athleteId: base.otherAthlete.membershipId, memberId: base.otherCoach.membershipId, role: 'coach' },
  ]);
  const org = { ...base, clinician2, inactiveClinician };
  const clients = new Map<Who, Promise<Client>>();
  const as = (who: Who) => {
    if (!clients.has(who)) clients.set(who, signedIn(h.app, (org[who] as MemberRef).email, TEST_PASSWORD));
    return clients.get(who)!;
  };
  return { org, base: `/api/orgs/${org.id}`, as };
}
let worldOnce: Promise<World> | null = null;
const world = () => (worldOnce ??= makeWorld());

/**
 * A minor athlete of their own, on the same care team (coach, clinician, clinician2, the deactivated
 * clinician) with the same guardian, signed in: for tests that count notices or read the status.
 */
async function freshAthlete(w: World): Promise<{ ref: MemberRef; client: Client }> {
  const ref = await createMember(h.ds, w.org.id, ['athlete'], { dateOfBirth: '2010-03-14' });
  await h.ds.getRepository(CareTeamAssignment).save(
    [w.org.coach, w.org.clinician, w.org.clinician2, w.org.inactiveClinician].map((m, i) => ({
      organizationId: w.org.id,
      athleteId: ref.membershipId,
      memberId: m.membershipId,
      role: i === 0 ? ('coach' as const) : ('clinician' as const),
    })),
  );
  await h.ds
    .getRepository(GuardianLink)
    .save({ organizationId: w.org.id, athleteId: ref.membershipId, guardianId: w.org.guardian.membershipId });
  return { ref, client: await signedIn(h.app, ref.email, TEST_PASSWORD) };
}

const fromToday = (n: number) => {
  const d = new Date(`${todayIso()}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + n);
  return d.toISOString().slice(0, 10);
};

const allNo = () => Object.fromEntries(RED_FLAG_ITEMS.map((i) => [i.id, false]));
const question = (id: string) => RED_FLAG_ITEMS.find((i) => i.id === id)!.question;

const reportBody = (athleteId: string, over: Record<string, unknown> = {}, yes: string[] = []) => ({
  athleteId,
  bodyRegions: ['lower_back'],
  painNow: 4,
  painWorst24h: 6,
  onsetDate: fromToday(-2),
  aggravatingPatterns: ['hinge'],
  startedInTraining: true,
  redFlags: { ...allNo(), ...Object.fromEntries(yes.map((id) => [id, true])) },
  ...over,
});

/** Notices about an athlete, as { recipient membership id: [kinds] }. */
async function noticesAbout(athleteId: string): Promise<Record<string, string[]>> {
  const rows: { recipient_id: string; kind: string }[] = await h.ds.query(
    'SELECT recipient_id, kind FROM notifications WHERE athlete_id = $1 ORDER BY kind',
    [athleteId],
  );
  const out: Record<string, string[]> = {};
  for (const r of rows) (out[r.recipient_id] ??= []).push(r.kind);
  return out;
}
const flagsAbout = async (athleteId: string): Promise<{ kind: string; severity: string; source_id: string; message: string }[]> =>
  h.ds.query('SELECT kind, severity, source_id, message FROM flags WHERE athlete_id = $1', [athleteId]);
const casesOf = async (athleteId: string): Promise<{ id: string; opened_by: string | null }[]> =>
  h.ds.query('SELECT id, opened_by FROM cases WHERE athlete_id = $1', [athleteId]);
const reportsOf = async (athleteId: string): Promise<number> =>
  Number((await h.ds.query('SELECT count(*) FROM pain_reports WHERE athlete_id = $1', [athleteId]))[0].count);

describe('a routine report (no red flag) — NICE NG59: no flags → reassure, care team informed', () => {
  it('pain 8 with no flag → 201 routine, not Out; one notice each to the care-team clinicians and coach, none to anyone else (REFERENCES §7 check 2)', async () => {
    const w = await world();
    const { ref, client } = await freshAthlete(w);
    const res = await client.post(`${w.base}/pain-reports`, reportBody(ref.membershipId, { painNow: 8, painWorst24h: 9 }));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ route: 'routine', statusSetToOut: false, emergencyNumber: EMERGENCY_NUMBER });
    expect(res.body.report).toMatchObject({
      athleteId: ref.membershipId,
      athleteName: ref.name,
      painNow: 8,
      painWorst24h: 9,
      route: 'routine',
      caseId: null,
    });
    expect(res.body.message).not.toMatch(/emergency|call 112/i);

    expect(await noticesAbout(ref.membershipId)).toEqual({
      [w.org.clinician.membershipId]: ['pain_report'],
      [w.org.clinician2.membershipId]: ['pain_report'],
      [w.org.coach.membershipId]: ['pain_report'],
    });
    expect(await flagsAbout(ref.membershipId)).toEqual([
      expect.objectContaining({ kind: 'pain_report', severity: 'routine', source_id: res.body.report.id }),
    ]);
    expect(await casesOf(ref.membershipId)).toEqual([]);
    const inForce = await (await w.as('clinician')).get(`${w.base}/athletes/${ref.membershipId}/in-force`);
    expect(inForce.body.status).toBe('full');
  });
});

describe('an emergency answer (possible cauda equina: NICE NG59; Finucane et al. 2020, JOSPT 50:350–372)', () => {
  let w: World;
  let athlete: MemberRef;
  let res: request.Response;
  const NOTE = `Private narrative ${randomUUID()}`;
  const rid = `test-${randomUUID()}`;

  beforeAll(async () => {
    w = await world();
    const fresh = await freshAthlete(w);
    athlete = fresh.ref;
    // Pain 2 only: an emergency item routes as an emergency whatever the pain (REFERENCES §7 check 1).
    res = await fresh.client
      .post(`${w.base}/pain-reports`, reportBody(athlete.membershipId, { painNow: 2, painWorst24h: 3, note: NOTE }, ['saddle_numbness']))
      .set('x-request-id', rid);
  });

  it("→ 201 emergency, set to Out, with a stop-and-seek-care message naming the organization's emergency number", () => {
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ route: 'emergency', statusSetToOut: true, emergencyNumber: EMERGENCY_NUMBER });
    expect(res.body.message).toContain(`call ${EMERGENCY_NUMBER}`);
    expect(res.body.message).not.toContain('911');
    expect(res.body.message).toMatch(/stop training/i);
    // The athlete reads their own report whole.
    expect(res.body.report).toMatchObject({ note: NOTE, redFlags: expect.objectContaining({ saddle_numbness: true }) });
  });

  it('a case opened by the system (openedByName null) carries the Out status; the report points to it', async () => {
    const cases = await casesOf(athlete.membershipId);
    expect(cases).toEqual([{ id: res.body.report.caseId, opened_by: null }]);
    const clin = await w.as('clinician');
    const list = await clin.get(`${w.base}/cases?athleteId=${athlete.membershipId}`);
    expect(list.status).toBe(200);
    expect(list.body).toEqual([
      expect.objectContaining({ id: res.body.report.caseId, openedByName: null, status: 'out', statusEffectiveFrom: todayIso() }),
    ]);
  });

  it("the athlete's status today is Out, on the caseload and in force", async () => {
    const clin = await w.as('clinician');
    const caseload = await clin.get(`${w.base}/caseload`);
    expect(caseload.body.find((r: { athleteId: string }) => r.athleteId === athlete.membershipId)).toMatchObject({
      status: 'out',
      openCaseCount: 1,
    });
    const inForce = await clin.get(`${w.base}/athletes/${athlete.membershipId}/in-force`);
    expect(inForce.body).toMatchObject({ status: 'out', statusEffectiveFrom: todayIso() });
  });

  it('audit: pain_report.created, case.opened and status.changed, each naming the athlete, none holding the note (SECURITY item 27)', async () => {
    const rows: { action: string; athlete_id: string; actor_user_id: string }[] = await h.ds.query(
      'SELECT action, athlete_id, actor_user_id, before, after FROM audit_entries WHERE request_id = $1 ORDER BY id',
      [rid],
    );
    expect(rows.map((r) => r.action)).toEqual(['pain_report.created', 'case.opened', 'status.changed']);
    for (const r of rows) expect(r).toMatchObject({ athlete_id: athlete.membershipId, actor_user_id: athlete.userId });
    expect(JSON.stringify(rows)).not.toContain(NOTE);
    expect(JSON.stringify(rows)).not.toContain('Private narrative');
  });

  it('a red_flag_emergency flag from the report', async () => {
    const flags = await flagsAbout(athlete.membershipId);
    expect(flags).toEqual([expect.objectContaining({ kind: 'red_flag_emergency', severity: 'emergency', source_id: res.body.report.id })]);
    // Coaches read flags, so the flag names no answer (PAIN_REPORT_FIELDS: coaches get no `redFlags`).
    expect(flags[0].message).not.toContain(question('saddle_numbness'));
    expect(flags[0].message).not.toContain(NOTE);
  });

  it("the clinicians' notices name the emergency answer, never the narrative", async () => {
    const rows: { body: string }[] = await h.ds.query('SELECT body FROM notifications WHERE athlete_id = $1 AND recipient_id = ANY($2)', [
      athlete.membershipId,
      [w.org.clinician.membershipId, w.org.clinician2.membershipId],
    ]);
    expect(rows).toHaveLength(2);
    for (const r of rows) {
      expect(r.body).toContain(question('saddle_numbness'));
      expect(r.body).not.toContain(NOTE);
    }
  });

  it('notices: every active care-team clinician, the coach (Out), the guardian of the minor — and nobody else', async () => {
    expect(await noticesAbout(athlete.membershipId)).toEqual({
      [w.org.clinician.membershipId]: ['red_flag_emergency'],
      [w.org.clinician2.membershipId]: ['red_flag_emergency'],
      [w.org.coach.membershipId]: ['status_out'],
      [w.org.guardian.membershipId]: ['red_flag_emergency_guardian'],
    });
  });

  it('the coach and guardian notices carry neither the narrative nor the red-flag answers (minimum necessary; policies/access/athlete-reports.ts)', async () => {
    const rows: { title: string; body: string }[] = await h.ds.query(
      'SELECT title, body FROM notifications WHERE athlete_id = $1 AND recipient_id = ANY($2)',
      [athlete.membershipId, [w.org.coach.membershipId, w.org.guardian.membershipId]],
    );
    expect(rows).toHaveLength(2);
    const text = JSON.stringify(rows);
    expect(text).not.toContain(NOTE);
    expect(text).not.toContain(question('saddle_numbness'));
  });
});

describe('an emergency answer with a case already open', () => {
  it('the most recent open case gets the Out status; no second case, no case.opened entry', async () => {
    const w = await world();
    const { ref, client } = await freshAthlete(w);
    const clin = await w.as('clinician');
    const opened = await clin.post(`${w.base}/cases`, {
      athleteId: ref.membershipId,
      bodyRegions: ['lower_back'],
      onsetDate: fromToday(-10),
      status: 'limited',
      statusEffectiveFrom: fromToday(-9),
    });
    expect(opened.status, JSON.stringify(opened.body)).toBe(201);
    const rid = `test-${randomUUID()}`;
    const res = await client
      .post(`${w.base}/pain-reports`, reportBody(ref.membershipId, {}, ['bladder_change', 'night_pain']))
      .set('x-request-id', rid);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ route: 'emergency', statusSetToOut: true, report: { caseId: opened.body.id } });

    expect((await casesOf(ref.membershipId)).map((c) => c.id)).toEqual([opened.body.id]);
    const detail = await clin.get(`${w.base}/cases/${opened.body.id}`);
    expect(detail.body).toMatchObject({ status: 'out', statusEffectiveFrom: todayIso(), version: 2 });
    expect(detail.body.statusHistory.map((s: { status: string }) => s.status)).toEqual(['out', 'limited']);
    const actions = (await h.ds.query('SELECT action FROM audit_entries WHERE request_id = $1 ORDER BY id', [rid])).map(
      (r: { action: string }) => r.action,
    );
    expect(actions).toEqual(['pain_report.created', 'status.changed']);
    // Emergency beats urgent: one emergency flag, no urgent one (REFERENCES §7).
    expect((await flagsAbout(ref.membershipId)).map((f) => f.kind)).toEqual(['red_flag_emergency']);
  });
});

describe('an urgent answer (NICE NG59; Finucane et al. 2020: review today)', () => {
  it('→ urgent, a red_flag_urgent flag, the clinicians told; not Out, no case, the coach and guardian not told', async () => {
    const w = await world();
    const { ref, client } = await freshAthlete(w);
    const res = await client.post(`${w.base}/pain-reports`, reportBody(ref.membershipId, { painNow: 3 }, ['cancer_history']));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ route: 'urgent', statusSetToOut: false, report: { route: 'urgent', caseId: null } });
    expect(res.body.message).toMatch(/contact your clinician today/i);
    expect(await flagsAbout(ref.membershipId)).toEqual([
      expect.objectContaining({ kind: 'red_flag_urgent', severity: 'urgent', source_id: res.body.report.id }),
    ]);
    expect(await noticesAbout(ref.membershipId)).toEqual({
      [w.org.clinician.membershipId]: ['red_flag_urgent'],
      [w.org.clinician2.membershipId]: ['red_flag_urgent'],
    });
    expect(await casesOf(ref.membershipId)).toEqual([]);
    expect((await (await w.as('clinician')).get(`${w.base}/athletes/${ref.membershipId}/in-force`)).body.status).toBe('full');
    // The answer reaches the clinicians in their notice; the flag, which coaches also read, does not carry it
    // (PAIN_REPORT_FIELDS: coaches get no `redFlags`).
    const bodies: { body: string }[] = await h.ds.query('SELECT body FROM notifications WHERE athlete_id = $1', [ref.membershipId]);
    for (const n of bodies) expect(n.body).toContain(question('cancer_history'));
    expect((await flagsAbout(ref.membershipId))[0].message).not.toContain(question('cancer_history'));
  });
});

describe('who may report, and a report must answer every question', () => {
  it('an athlete cannot report for another athlete → 404; nothing stored (SECURITY item 14)', async () => {
    const w = await world();
    const res = await (
      await w.as('athlete')
    ).post(`${w.base}/pain-reports`, reportBody(w.org.otherAthlete.membershipId, {}, ['both_legs']));
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
    expect(await reportsOf(w.org.otherAthlete.membershipId)).toBe(0);
    expect(await casesOf(w.org.otherAthlete.membershipId)).toEqual([]);
  });

  it.each(['coach', 'clinician', 'guardian', 'admin'] as const)('%s cannot file a report for the athlete → 403', async (who) => {
    const w = await world();
    const before = await reportsOf(w.org.athlete.membershipId);
    const res = await (await w.as(who)).post(`${w.base}/pain-reports`, reportBody(w.org.athlete.membershipId));
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('forbidden');
    expect(await reportsOf(w.org.athlete.membershipId)).toBe(before);
  });

  it("another organization's athlete cannot report into ours (SECURITY item 15)", async () => {
    const w = await world();
    const outsiderOrg = await createOrg(h.ds);
    const outsider = await signedIn(h.app, outsiderOrg.athlete.email, TEST_PASSWORD);
    const res = await outsider.post(`${w.base}/pain-reports`, reportBody(outsiderOrg.athlete.membershipId));
    expect([403, 404]).toContain(res.status);
    expect(await reportsOf(outsiderOrg.athlete.membershipId)).toBe(0);
  });

  it('signed out → 401', async () => {
    const w = await world();
    expect((await request(h.app).get(`${w.base}/pain-reports`)).status).toBe(401);
  });

  it('a report missing one red-flag answer → 400 naming that item; nothing stored (NICE NG59: every question asked)', async () => {
    const w = await world();
    const body = reportBody(w.org.athlete.membershipId);
    delete (body.redFlags as Record<string, boolean>).night_pain;
    const before = await reportsOf(w.org.athlete.membershipId);
    const res = await (await w.as('athlete')).post(`${w.base}/pain-reports`, body);
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['redFlags.night_pain']);
    expect(await reportsOf(w.org.athlete.membershipId)).toBe(before);
  });
});

describe('reading reports (minimum necessary, policies/access/athlete-reports.ts PAIN_REPORT_FIELDS)', () => {
  let w: World;
  const NOTE = `Hurts when I deadlift ${randomUUID()}`;
  let reportId: string;

  beforeAll(async () => {
    w = await world();
    const res = await (
      await w.as('athlete')
    ).post(`${w.base}/pain-reports`, reportBody(w.org.athlete.membershipId, { note: NOTE }, ['night_pain']));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    reportId = res.body.report.id;
  });

  it('the clinician sees the note and the red-flag answers', async () => {
    const res = await (await w.as('clinician')).get(`${w.base}/pain-reports?athleteId=${w.org.athlete.membershipId}`);
    expect(res.status).toBe(200);
    const mine = res.body.find((r: { id: string }) => r.id === reportId);
    expect(mine).toMatchObject({
      note: NOTE,
      redFlags: expect.objectContaining({ night_pain: true, both_legs: false }),
      painNow: 4,
      route: 'urgent',
    });
  });

  it('the coach sees scores and places but no `note` and no `redFlags` keys', async () => {
    const res = await (await w.as('coach')).get(`${w.base}/pain-reports`);
    expect(res.status).toBe(200);
    const mine = res.body.find((r: { id: string }) => r.id === reportId);
    expect(mine).toMatchObject({ painNow: 4, painWorst24h: 6, bodyRegions: ['lower_back'], route: 'urgent' });
    for (const r of res.body) {
      expect(r).not.toHaveProperty('note');
      expect(r).not.toHaveProperty('redFlags');
    }
    expect(JSON.stringify(res.body)).not.toContain(NOTE);
  });

  it("another care team's coach and clinician see none of the athlete's reports (SECURITY item 14)", async () => {
    for (const who of ['otherCoach', 'otherClinician'] as const) {
      const res = await (await w.as(who)).get(`${w.base}/pain-reports`);
      expect(res.status).toBe(200);
      expect(res.body.map((r: { athleteId: string }) => r.athleteId)).not.toContain(w.org.athlete.membershipId);
      const filtered = await (await w.as(who)).get(`${w.base}/pain-reports?athleteId=${w.org.athlete.membershipId}`);
      expect(filtered.body).toEqual([]);
    }
  });

  it('the athlete lists only their own reports', async () => {
    const res = await (await w.as('athlete')).get(`${w.base}/pain-reports`);
    expect(res.status).toBe(200);
    expect(res.body.length).toBeGreaterThan(0);
    expect(new Set(res.body.map((r: { athleteId: string }) => r.athleteId))).toEqual(new Set([w.org.athlete.membershipId]));
  });

  it.each(['guardian', 'admin'] as const)('%s → 403 on /pain-reports (they read no reports)', async (who) => {
    const res = await (await w.as(who)).get(`${w.base}/pain-reports?athleteId=${w.org.athlete.membershipId}`);
    expect(res.status).toBe(403);
    expect(JSON.stringify(res.body)).not.toContain(NOTE);
  });
});
