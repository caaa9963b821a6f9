import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { RED_FLAG_ITEMS } from '../../../../policies/red-flags';
import { CareTeamAssignment } from '../../entities';
import { signedIn, useHarness, type Client } from '../../test/harness';
import { createOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../../test/factories';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

type Who = 'admin' | 'coach' | 'clinician' | 'athlete' | 'guardian' | 'otherAthlete' | 'otherCoach' | 'otherClinician';

interface World {
  org: TestOrg;
  base: string;
  as: (who: Who) => Promise<Client>;
  /** Flag ids by what raised them. */
  flags: { painRule: string; urgent: string; otherPainRule: string };
}

const allNo = () => Object.fromEntries(RED_FLAG_ITEMS.map((i) => [i.id, false]));
const CANCER_QUESTION = RED_FLAG_ITEMS.find((i) => i.id === 'cancer_history')!.question;

/**
 * One organization with two care teams, and three flags raised through the API: a pain-rule flag and
 * an urgent red flag for the factory athlete, and a pain-rule flag for otherAthlete (whose care team
 * is otherCoach + otherClinician).
 */
async function makeWorld(): Promise<World> {
  const org = await createOrg(h.ds);
  await h.ds.getRepository(CareTeamAssignment).save([
    { organizationId: org.id, athleteId: org.otherAthlete.membershipId, memberId: org.otherClinician.membershipId, role: 'clinician' },
    { organizationId: org.id, athleteId: org.otherAthlete.membershipId, memberId: org.otherCoach.membershipId, role: 'coach' },
  ]);
  const clients = new Map<Who, Promise<Client>>();
  const as = (who: Who) => {
    if (!clients.has(who)) clients.set(who, signedIn(h.app, (org[who] as MemberRef).email, TEST_PASSWORD));
    return clients.get(who)!;
  };
  const base = `/api/orgs/${org.id}`;
  // Pain 7 during, over the default ceiling of 5 (Silbernagel et al. 2007, AJSM 35:897–906).
  const painful = (athleteId: string) => ({
    athleteId,
    date: '2026-01-05',
    durationMinutes: 45,
    sessionRpe: 6,
    painBefore: 1,
    painDuring: 7,
  });
  const log = await (await as('athlete')).post(`${base}/training-logs`, painful(org.athlete.membershipId));
  const otherLog = await (await as('otherAthlete')).post(`${base}/training-logs`, painful(org.otherAthlete.membershipId));
  const report = await (
    await as('athlete')
  ).post(`${base}/pain-reports`, {
    athleteId: org.athlete.membershipId,
    bodyRegions: ['lower_back'],
    painNow: 3,
    painWorst24h: 5,
    onsetDate: '2026-01-04',
    startedInTraining: false,
    redFlags: { ...allNo(), cancer_history: true },
  });
  for (const r of [log, otherLog, report]) expect(r.status, JSON.stringify(r.body)).toBe(201);
  const flagOf = async (sourceId: string) => (await h.ds.query('SELECT id FROM flags WHERE source_id = $1', [sourceId]))[0].id as string;
  return {
    org,
    base,
    as,
    flags: {
      painRule: await flagOf(log.body.log.id),
      urgent: await flagOf(report.body.report.id),
      otherPainRule: await flagOf(otherLog.body.log.id),
    },
  };
}
let worldOnce: Promise<World> | null = null;
const world = () => (worldOnce ??= makeWorld());

const flagRow = async (id: string) => (await h.ds.query('SELECT acknowledged_at, acknowledged_by FROM flags WHERE id = $1', [id]))[0];

describe('listing flags (policies/access/athlete-reports.ts: the care team reads its athletes’ flags)', () => {
  let w: World;
  beforeAll(async () => {
    w = await world();
  });

  it('the coach and clinician see their athlete’s flags and not another care team’s (ASVS 5.0 V8.2.2)', async () => {
    for (const who of ['coach', 'clinician'] as const) {
      const res = await (await w.as(who)).get(`${w.base}/flags?state=all`);
      expect(res.status, who).toBe(200);
      const ids = res.body.map((f: { id: string }) => f.id);
      expect(ids, who).toEqual(expect.arrayContaining([w.flags.painRule, w.flags.urgent]));
      expect(ids, who).not.toContain(w.flags.otherPainRule);
      expect(new Set(res.body.map((f: { athleteId: string }) => f.athleteId))).toEqual(new Set([w.org.athlete.membershipId]));
    }
    for (const who of ['otherCoach', 'otherClinician'] as const) {
      const res = await (await w.as(who)).get(`${w.base}/flags?state=all`);
      expect(
        res.body.map((f: { id: string }) => f.id),
        who,
      ).toEqual([w.flags.otherPainRule]);
    }
  });

  it('filtering by another team’s athlete gives nothing, not their flags', async () => {
    const res = await (await w.as('coach')).get(`${w.base}/flags?state=all&athleteId=${w.org.otherAthlete.membershipId}`);
    expect(res.status).toBe(200);
    expect(res.body).toEqual([]);
  });

  it('a flag names its kind, severity and suggestion (Silbernagel et al. 2007: reduce the next session)', async () => {
    const res = await (await w.as('clinician')).get(`${w.base}/flags?state=all&athleteId=${w.org.athlete.membershipId}`);
    const byId = new Map(res.body.map((f: { id: string }) => [f.id, f]));
    expect(byId.get(w.flags.painRule)).toMatchObject({
      kind: 'pain_rule',
      severity: 'routine',
      suggestedAction: 'reduce',
      athleteName: w.org.athlete.name,
    });
    expect(byId.get(w.flags.urgent)).toMatchObject({ kind: 'red_flag_urgent', severity: 'urgent', suggestedAction: null });
  });

  it('the coach reads no red-flag answer through a flag (minimum necessary: PAIN_REPORT_FIELDS gives coaches no `redFlags`)', async () => {
    const res = await (await w.as('coach')).get(`${w.base}/flags?state=all`);
    expect(res.body.map((f: { id: string }) => f.id)).toContain(w.flags.urgent);
    expect(JSON.stringify(res.body)).not.toContain(CANCER_QUESTION);
  });

  it.each(['athlete', 'guardian', 'admin'] as const)('%s → 403 on /flags (flags are for the care team)', async (who) => {
    const res = await (await w.as(who)).get(`${w.base}/flags?state=all`);
    expect(res.status).toBe(403);
  });

  it('signed out → 401; an unknown state → 400', async () => {
    expect((await request(h.app).get(`${w.base}/flags`)).status).toBe(401);
    const bad = await (await w.as('coach')).get(`${w.base}/flags?state=closed`);
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(['state']);
  });
});

describe('acknowledging a flag', () => {
  let w: World;
  beforeAll(async () => {
    w = await world();
  });

  it('another care team’s coach or clinician → 404, and the flag stays open (ASVS 5.0 V8.2.2)', async () => {
    for (const who of ['otherCoach', 'otherClinician'] as const) {
      const res = await (await w.as(who)).post(`${w.base}/flags/${w.flags.painRule}/acknowledge`);
      expect(res.status, who).toBe(404);
    }
    for (const who of ['athlete', 'guardian'] as const) {
      expect((await (await w.as(who)).post(`${w.base}/flags/${w.flags.painRule}/acknowledge`)).status, who).toBe(403);
    }
    expect(await flagRow(w.flags.painRule)).toEqual({ acknowledged_at: null, acknowledged_by: null });
  });

  it("another organization's clinician → 404 (ASVS 5.0 V8.4.1)", async () => {
    const outsiderOrg = await createOrg(h.ds);
    const outsider = await signedIn(h.app, outsiderOrg.clinician.email, TEST_PASSWORD);
    for (const base of [`/api/orgs/${outsiderOrg.id}`, w.base]) {
      const res = await outsider.post(`${base}/flags/${w.flags.painRule}/acknowledge`);
      expect([403, 404], base).toContain(res.status);
    }
    expect((await outsider.post(`/api/orgs/${outsiderOrg.id}/flags/${w.flags.painRule}/acknowledge`)).status).toBe(404);
    expect((await flagRow(w.flags.painRule)).acknowledged_at).toBeNull();
  });

  it('the care-team clinician acknowledges: acknowledgedAt and by whom are set, audited once as flag.acknowledged (45 CFR 164.312(b); ASVS 5.0 V16.2)', async () => {
    const clin = await w.as('clinician');
    const rid = `test-${randomUUID()}`;
    const res = await clin.post(`${w.base}/flags/${w.flags.painRule}/acknowledge`).set('x-request-id', rid);
    expect(res.status).toBe(204);
    const row = await flagRow(w.flags.painRule);
    expect(row.acknowledged_at).toBeInstanceOf(Date);
    expect(row.acknowledged_by).toBe(w.org.clinician.userId);
    const audit = await h.ds.query('SELECT action, subject_id, athlete_id, actor_user_id FROM audit_entries WHERE request_id = $1', [rid]);
    expect(audit).toEqual([
      {
        action: 'flag.acknowledged',
        subject_id: w.flags.painRule,
        athlete_id: w.org.athlete.membershipId,
        actor_user_id: w.org.clinician.userId,
      },
    ]);

    // A second acknowledgement changes nothing and writes no second entry.
    const again = await (await w.as('coach')).post(`${w.base}/flags/${w.flags.painRule}/acknowledge`);
    expect(again.status).toBe(204);
    expect(await flagRow(w.flags.painRule)).toEqual(row);
    const entries = await h.ds.query(
      `SELECT count(*)::int AS n FROM audit_entries WHERE action = 'flag.acknowledged' AND subject_id = $1`,
      [w.flags.painRule],
    );
    expect(entries[0].n).toBe(1);
  });

  it('open / acknowledged / all lists follow the acknowledgement', async () => {
    const coach = await w.as('coach');
    const ids = async (state: string) => (await coach.get(`${w.base}/flags?state=${state}`)).body.map((f: { id: string }) => f.id);
    const open = await ids('open');
    expect(open).toContain(w.flags.urgent);
    expect(open).not.toContain(w.flags.painRule);
    expect(await ids('acknowledged')).toEqual([w.flags.painRule]);
    expect((await ids('all')).sort()).toEqual([w.flags.painRule, w.flags.urgent].sort());
    // Default is open.
    expect((await coach.get(`${w.base}/flags`)).body.map((f: { id: string }) => f.id)).toEqual(open);
    const acked = (await coach.get(`${w.base}/flags?state=acknowledged`)).body[0];
    expect(acked).toMatchObject({ acknowledgedByName: w.org.clinician.name, acknowledgedAt: expect.any(String) });
  });
});

describe('notifications (everyone reads and clears only their own)', () => {
  let w: World;
  const idsOf = async (who: Who) =>
    (await (await w.as(who)).get(`${w.base}/notifications`)).body.map((n: { id: string }) => n.id) as string[];
  const dbIdsOf = async (m: MemberRef) =>
    (await h.ds.query('SELECT id FROM notifications WHERE recipient_id = $1', [m.membershipId])).map(
      (r: { id: string }) => r.id,
    ) as string[];
  const readAt = async (id: string) => (await h.ds.query('SELECT read_at FROM notifications WHERE id = $1', [id]))[0].read_at;

  beforeAll(async () => {
    w = await world();
  });

  it('each person lists exactly their own notices (the pain-rule notice reaches coach and clinician; the urgent one the clinician only)', async () => {
    const coach = await (await w.as('coach')).get(`${w.base}/notifications`);
    expect(coach.status).toBe(200);
    expect(coach.body.map((n: { kind: string }) => n.kind)).toEqual(['pain_rule']);
    expect((await idsOf('coach')).sort()).toEqual((await dbIdsOf(w.org.coach)).sort());
    const clin = (await (await w.as('clinician')).get(`${w.base}/notifications`)).body;
    expect(clin.map((n: { kind: string }) => n.kind).sort()).toEqual(['pain_rule', 'red_flag_urgent']);
    expect(clin.every((n: { athleteId: string; readAt: null }) => n.athleteId === w.org.athlete.membershipId && n.readAt === null)).toBe(
      true,
    );
    expect((await idsOf('clinician')).sort()).toEqual((await dbIdsOf(w.org.clinician)).sort());
    expect(await idsOf('otherClinician')).toEqual(await dbIdsOf(w.org.otherClinician));
    expect(await idsOf('otherClinician')).not.toContain(clin[0].id);
  });

  it("marking another person's notice read → 404 and it stays unread; my own → read (ASVS 5.0 V8.2.2)", async () => {
    const [clinNotice] = await dbIdsOf(w.org.clinician);
    const res = await (await w.as('coach')).post(`${w.base}/notifications/${clinNotice}/read`);
    expect(res.status).toBe(404);
    expect(await readAt(clinNotice)).toBeNull();

    const [coachNotice] = await dbIdsOf(w.org.coach);
    const own = await (await w.as('coach')).post(`${w.base}/notifications/${coachNotice}/read`);
    expect(own.status).toBe(204);
    expect(await readAt(coachNotice)).toBeInstanceOf(Date);
    const listed = (await (await w.as('coach')).get(`${w.base}/notifications`)).body.find((n: { id: string }) => n.id === coachNotice);
    expect(listed.readAt).toEqual(expect.any(String));
  });

  it('read-all marks every one of mine and none of anyone else’s', async () => {
    const otherUnread = await dbIdsOf(w.org.otherClinician);
    expect(otherUnread.length).toBeGreaterThan(0);
    const res = await (await w.as('clinician')).post(`${w.base}/notifications/read-all`);
    expect(res.status).toBe(204);
    for (const id of await dbIdsOf(w.org.clinician)) expect(await readAt(id)).toBeInstanceOf(Date);
    for (const id of otherUnread) expect(await readAt(id)).toBeNull();
  });

  it('signed out → 401', async () => {
    expect((await request(h.app).get(`${w.base}/notifications`)).status).toBe(401);
    expect((await request(h.app).post(`${w.base}/notifications/read-all`)).status).toBeGreaterThanOrEqual(401);
  });
});
