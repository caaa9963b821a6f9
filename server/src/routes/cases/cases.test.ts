import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { todayIso } from '../../../../policies/roles';
import { CareTeamAssignment } from '../../entities';
import { signedIn, useHarness, type Client } from '../../test/harness';
import { createMember, createOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../../test/factories';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

type Who = 'admin' | 'coach' | 'clinician' | 'athlete' | 'guardian' | 'otherCoach' | 'otherClinician';

interface World {
  org: TestOrg;
  base: string;
  as: (who: Who) => Promise<Client>;
}

/**
 * One organization with two care teams: the factory's (coach + clinician + guardian around the minor
 * athlete) and a second one (otherCoach + otherClinician around otherAthlete), so "same role, other
 * care team" is a real clinician or coach with athletes of their own (SECURITY item 14).
 */
async function world(): Promise<World> {
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
  return { org, base: `/api/orgs/${org.id}`, as };
}

/**
 * Sign-ins cost a bcrypt comparison each (cost 12), so the file shares one organization and its
 * signed-in people; a test that looks at an athlete's whole picture (caseload, in-force, trail) gets
 * an athlete of its own on the same care team, so no test reads another's rows.
 */
let sharedWorld: Promise<World> | null = null;
const shared = () => (sharedWorld ??= world());

async function freshAthlete(w: World): Promise<string> {
  const a = await createMember(h.ds, w.org.id, ['athlete'], { dateOfBirth: '2010-03-14' });
  await h.ds.getRepository(CareTeamAssignment).save([
    { organizationId: w.org.id, athleteId: a.membershipId, memberId: w.org.clinician.membershipId, role: 'clinician' },
    { organizationId: w.org.id, athleteId: a.membershipId, memberId: w.org.coach.membershipId, role: 'coach' },
  ]);
  return a.membershipId;
}

/** 'YYYY-MM-DD' n days from today (UTC, as the server's todayIso). */
const fromToday = (n: number) => {
  const d = new Date(`${todayIso()}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + n);
  return d.toISOString().slice(0, 10);
};

const caseBody = (athleteId: string, over: Record<string, unknown> = {}) => ({
  athleteId,
  bodyRegions: ['lower_back'],
  onsetDate: fromToday(-20),
  diagnosis: 'Lumbar strain',
  clinicalNotes: 'Tender L4-L5 on palpation',
  status: 'limited',
  statusEffectiveFrom: fromToday(-19),
  statusNote: 'Light work only',
  reviewDate: fromToday(14),
  ...over,
});

/** Opens a case as the clinician, for the factory's athlete unless `over.athleteId` names another. */
async function openCase(c: Client, w: World, over: Record<string, unknown> = {}): Promise<{ id: string; version: number }> {
  const res = await c.post(`${w.base}/cases`, caseBody(w.org.athlete.membershipId, over));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body;
}

const caseRow = async (id: string) =>
  (
    await h.ds.query(
      'SELECT organization_id, athlete_id, diagnosis, clinical_notes, review_date::text, closed_on::text, version FROM cases WHERE id = $1',
      [id],
    )
  )[0];
const casesOf = async (athleteId: string): Promise<number> =>
  Number((await h.ds.query('SELECT count(*) FROM cases WHERE athlete_id = $1', [athleteId]))[0].count);
const statusRows = async (caseId: string): Promise<number> =>
  Number((await h.ds.query('SELECT count(*) FROM participation_status_changes WHERE case_id = $1', [caseId]))[0].count);

describe('who may do what with a case (SECURITY items 13–15; CONVENTIONS practice 4)', () => {
  let w: World;
  let caseId: string;
  let outsiderOrg: TestOrg;
  let outsider: Client;

  beforeAll(async () => {
    w = await shared();
    caseId = (await openCase(await w.as('clinician'), w)).id;
    outsiderOrg = await createOrg(h.ds);
    outsider = await signedIn(h.app, outsiderOrg.clinician.email, TEST_PASSWORD);
  });

  type Action = 'create' | 'read' | 'update' | 'status' | 'close';
  const call = (c: Client, base: string, action: Action, athleteId: string) => {
    switch (action) {
      case 'create':
        return c.post(`${base}/cases`, caseBody(athleteId));
      case 'read':
        return c.get(`${base}/cases/${caseId}`);
      case 'update':
        return c.patch(`${base}/cases/${caseId}`, { reviewDate: fromToday(30), version: 1 });
      case 'status':
        return c.post(`${base}/cases/${caseId}/status`, { status: 'full', effectiveFrom: fromToday(0), version: 1 });
      case 'close':
        return c.post(`${base}/cases/${caseId}/close`, { closedOn: fromToday(0), version: 1 });
    }
  };

  // Policy: caseRules (policies/access/case.ts). A role with no rule for the action at all answers 403
  // before any record is loaded; a role that has the action for its own athletes gets 404 on another
  // care team's record (SECURITY item 14), so the record's existence is never revealed.
  const table: [Who, Record<Action, number>][] = [
    ['coach', { create: 403, read: 200, update: 403, status: 403, close: 403 }],
    ['athlete', { create: 403, read: 200, update: 403, status: 403, close: 403 }],
    ['guardian', { create: 403, read: 200, update: 403, status: 403, close: 403 }],
    ['admin', { create: 403, read: 200, update: 403, status: 403, close: 403 }],
    ['otherClinician', { create: 404, read: 404, update: 404, status: 404, close: 404 }],
    ['otherCoach', { create: 403, read: 404, update: 403, status: 403, close: 403 }],
  ];

  for (const [who, expected] of table) {
    for (const action of Object.keys(expected) as Action[]) {
      it(`${who} ${action} → ${expected[action]}`, async () => {
        const before = await casesOf(w.org.athlete.membershipId);
        const res = await call(await w.as(who), w.base, action, w.org.athlete.membershipId);
        expect(res.status, JSON.stringify(res.body)).toBe(expected[action]);
        if (expected[action] >= 400) {
          expect(res.body.error.code).toBe(expected[action] === 404 ? 'not_found' : 'forbidden');
          expect(JSON.stringify(res.body)).not.toContain('Lumbar strain');
          expect(await casesOf(w.org.athlete.membershipId)).toBe(before);
        }
      });
    }
  }

  it("another organization's clinician gets 404 on the case, through their own organization or ours (SECURITY item 15)", async () => {
    for (const base of [`/api/orgs/${outsiderOrg.id}`, w.base]) {
      for (const action of ['read', 'update', 'status', 'close'] as Action[]) {
        const res = await call(outsider, base, action, w.org.athlete.membershipId);
        expect(res.status, `${base} ${action}`).toBe(404);
      }
    }
    // Opening a case in their own organization for our athlete: not a member there, refused.
    const before = await casesOf(w.org.athlete.membershipId);
    const res = await call(outsider, `/api/orgs/${outsiderOrg.id}`, 'create', w.org.athlete.membershipId);
    expect(res.status).toBeGreaterThanOrEqual(400);
    expect(res.status).toBeLessThan(500);
    expect(await casesOf(w.org.athlete.membershipId)).toBe(before);
  });

  it('signed out, the case routes answer 401 (SECURITY item 12)', async () => {
    const anon = request(h.app);
    expect((await anon.get(`${w.base}/cases/${caseId}`)).status).toBe(401);
    expect((await anon.get(`${w.base}/cases`)).status).toBe(401);
    expect((await anon.get(`${w.base}/caseload`)).status).toBe(401);
  });

  it('none of the refused calls changed the case: one status, version 1, still open', async () => {
    expect(await statusRows(caseId)).toBe(1);
    expect(await caseRow(caseId)).toMatchObject({ version: 1, closed_on: null, review_date: fromToday(14) });
  });

  it('a clinician cannot open a case for an athlete outside their care team, even in their organization (SECURITY item 14)', async () => {
    const clin = await w.as('clinician');
    const res = await clin.post(`${w.base}/cases`, caseBody(w.org.otherAthlete.membershipId));
    expect([403, 404]).toContain(res.status);
    expect(await casesOf(w.org.otherAthlete.membershipId)).toBe(0);
  });

  it('the clinician on the care team may create, read, update, set status and close', async () => {
    const clin = await w.as('clinician');
    const created = await openCase(clin, w);
    const read = await clin.get(`${w.base}/cases/${created.id}`);
    expect(read.status).toBe(200);
    const upd = await clin.patch(`${w.base}/cases/${created.id}`, { reviewDate: fromToday(21), version: 1 });
    expect(upd.status, JSON.stringify(upd.body)).toBe(200);
    expect(upd.body).toMatchObject({ reviewDate: fromToday(21), version: 2 });
    const st = await clin.post(`${w.base}/cases/${created.id}/status`, { status: 'full', effectiveFrom: fromToday(0), version: 2 });
    expect(st.status, JSON.stringify(st.body)).toBe(201);
    const closed = await clin.post(`${w.base}/cases/${created.id}/close`, { closedOn: fromToday(0), version: 3 });
    expect(closed.status, JSON.stringify(closed.body)).toBe(200);
    expect(closed.body).toMatchObject({ closedOn: fromToday(0), version: 4 });
  });
});

describe('what each role sees of a case (SECURITY item 16; 45 CFR 164.502(b) minimum necessary)', () => {
  let w: World;
  let caseId: string;
  const DIAGNOSIS = `Spondylolysis ${randomUUID()}`;
  const NOTES = `Pars defect suspected ${randomUUID()}`;

  beforeAll(async () => {
    w = await shared();
    caseId = (await openCase(await w.as('clinician'), w, { diagnosis: DIAGNOSIS, clinicalNotes: NOTES })).id;
  });

  // The exact response shape of GET /cases/:id per role, sorted: a change here is a permission change.
  const SHAPES: Record<'clinician' | 'coach' | 'athlete' | 'guardian' | 'admin', string[]> = {
    clinician: [
      'athleteId',
      'athleteName',
      'bodyRegions',
      'clinicalNotes',
      'closedOn',
      'closingNote',
      'diagnosis',
      'id',
      'onsetDate',
      'openedAt',
      'openedByName',
      'organizationId',
      'planId',
      'reviewDate',
      'status',
      'statusEffectiveFrom',
      'statusHistory',
      'statusNote',
      'version',
    ],
    coach: [
      'athleteId',
      'athleteName',
      'bodyRegions',
      'closedOn',
      'closingNote',
      'id',
      'onsetDate',
      'openedAt',
      'openedByName',
      'organizationId',
      'planId',
      'reviewDate',
      'status',
      'statusEffectiveFrom',
      'statusHistory',
      'statusNote',
      'version',
    ],
    athlete: [
      'athleteId',
      'athleteName',
      'bodyRegions',
      'closedOn',
      'closingNote',
      'diagnosis',
      'id',
      'onsetDate',
      'openedAt',
      'openedByName',
      'organizationId',
      'planId',
      'reviewDate',
      'status',
      'statusEffectiveFrom',
      'statusHistory',
      'statusNote',
      'version',
    ],
    guardian: [
      'athleteId',
      'athleteName',
      'closedOn',
      'id',
      'openedAt',
      'organizationId',
      'planId',
      'reviewDate',
      'status',
      'statusEffectiveFrom',
      'statusHistory',
      'statusNote',
      'version',
    ],
    admin: ['athleteId', 'athleteName', 'closedOn', 'id', 'openedAt', 'organizationId', 'status', 'statusEffectiveFrom', 'version'],
  };

  for (const [who, keys] of Object.entries(SHAPES) as [keyof typeof SHAPES, string[]][]) {
    it(`${who}: exactly these fields`, async () => {
      const res = await (await w.as(who)).get(`${w.base}/cases/${caseId}`);
      expect(res.status).toBe(200);
      expect(Object.keys(res.body).sort()).toEqual(keys);
    });
  }

  it('the clinical text itself never reaches coach, guardian or admin; notes never reach the athlete (SECURITY item 16)', async () => {
    for (const who of ['coach', 'guardian', 'admin'] as const) {
      const c = await w.as(who);
      for (const path of [`/cases/${caseId}`, '/cases', `/cases?athleteId=${w.org.athlete.membershipId}`, '/caseload']) {
        const res = await c.get(`${w.base}${path}`);
        expect(res.status, `${who} ${path}`).toBe(200);
        const text = JSON.stringify(res.body);
        expect(text, `${who} ${path}`).not.toContain(DIAGNOSIS);
        expect(text, `${who} ${path}`).not.toContain(NOTES);
      }
    }
    const athlete = await w.as('athlete');
    const own = await athlete.get(`${w.base}/cases/${caseId}`);
    expect(own.body.diagnosis).toBe(DIAGNOSIS);
    expect(JSON.stringify(own.body)).not.toContain(NOTES);
    expect(JSON.stringify((await athlete.get(`${w.base}/cases`)).body)).not.toContain(NOTES);
  });

  it('the clinician reads the notes on the case; the list leaves them out (they are read one case at a time, audited)', async () => {
    const clin = await w.as('clinician');
    expect((await clin.get(`${w.base}/cases/${caseId}`)).body.clinicalNotes).toBe(NOTES);
    const list = await clin.get(`${w.base}/cases`);
    const mine = list.body.find((c: { id: string }) => c.id === caseId);
    expect(mine.diagnosis).toBe(DIAGNOSIS);
    expect(mine).not.toHaveProperty('clinicalNotes');
    expect(JSON.stringify(list.body)).not.toContain(NOTES);
  });

  it("GET as the clinician writes a 'case.viewed' entry naming the case and athlete (SECURITY item 27; 45 CFR 164.312(b))", async () => {
    const rid = `test-${randomUUID()}`;
    const res = await (await w.as('clinician')).get(`${w.base}/cases/${caseId}`).set('x-request-id', rid);
    expect(res.status).toBe(200);
    const rows = await h.ds.query(
      'SELECT action, subject_id, athlete_id, actor_user_id, organization_id FROM audit_entries WHERE request_id = $1',
      [rid],
    );
    expect(rows).toEqual([
      {
        action: 'case.viewed',
        subject_id: caseId,
        athlete_id: w.org.athlete.membershipId,
        actor_user_id: w.org.clinician.userId,
        organization_id: w.org.id,
      },
    ]);
  });
});

describe('editing a case', () => {
  it('PATCH with a stale version → 409 and the first edit stands (SECURITY item 32)', async () => {
    const w = await shared();
    const clin = await w.as('clinician');
    const { id } = await openCase(clin, w);
    const first = await clin.patch(`${w.base}/cases/${id}`, { diagnosis: 'Facet irritation', version: 1 });
    expect(first.status).toBe(200);
    const stale = await clin.patch(`${w.base}/cases/${id}`, { diagnosis: 'Disc bulge', version: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('version_conflict');
    expect(stale.body.error.message).toMatch(/Reload/);
    expect(await caseRow(id)).toMatchObject({ diagnosis: 'Facet irritation', version: 2 });
  });

  it('PATCH carrying organizationId, athleteId or role → 400 and nothing changes (SECURITY item 16)', async () => {
    const w = await shared();
    const other = await createOrg(h.ds);
    const clin = await w.as('clinician');
    const { id } = await openCase(clin, w);
    const before = await caseRow(id);
    for (const extra of [{ organizationId: other.id }, { athleteId: w.org.otherAthlete.membershipId }, { role: 'admin' }]) {
      const res = await clin.patch(`${w.base}/cases/${id}`, { diagnosis: 'Changed', version: 1, ...extra });
      expect(res.status, JSON.stringify(extra)).toBe(400);
      expect(Object.keys(res.body.error.fields)).toEqual(Object.keys(extra));
    }
    expect(await caseRow(id)).toEqual(before);
    expect(before).toMatchObject({
      organization_id: w.org.id,
      athlete_id: w.org.athlete.membershipId,
      diagnosis: 'Lumbar strain',
      version: 1,
    });
  });

  it('a coach trying to write a diagnosis → 403 and nothing changes (SECURITY item 16)', async () => {
    const w = await shared();
    const { id } = await openCase(await w.as('clinician'), w);
    const res = await (await w.as('coach')).patch(`${w.base}/cases/${id}`, { diagnosis: 'Coach guess', version: 1 });
    expect(res.status).toBe(403);
    expect(await caseRow(id)).toMatchObject({ diagnosis: 'Lumbar strain', version: 1 });
  });
});

describe('participation status over time (Ardern et al. 2016, BJSM 50:853–864: a continuum from modified training to full)', () => {
  it('Out → Limited → Full with dates: history newest first, status today is the latest already in effect', async () => {
    const w = await shared();
    const athleteId = await freshAthlete(w);
    const clin = await w.as('clinician');
    const { id } = await openCase(clin, w, { athleteId, status: 'out', statusEffectiveFrom: fromToday(-10), statusNote: 'Rest' });
    const limited = await clin.post(`${w.base}/cases/${id}/status`, {
      status: 'limited',
      effectiveFrom: fromToday(-5),
      note: 'Light work',
      version: 1,
    });
    expect(limited.status, JSON.stringify(limited.body)).toBe(201);
    const full = await clin.post(`${w.base}/cases/${id}/status`, {
      status: 'full',
      effectiveFrom: fromToday(5),
      note: 'Back to all training',
      version: 2,
    });
    expect(full.status, JSON.stringify(full.body)).toBe(201);
    expect(
      full.body.statusHistory.map((s: { status: string; effectiveFrom: string; note: string }) => [s.status, s.effectiveFrom, s.note]),
    ).toEqual([
      ['full', fromToday(5), 'Back to all training'],
      ['limited', fromToday(-5), 'Light work'],
      ['out', fromToday(-10), 'Rest'],
    ]);
    expect(full.body.statusHistory[0].setByName).toBe(w.org.clinician.name);
    // Full starts in five days: today the athlete is still Limited.
    expect(full.body).toMatchObject({ status: 'limited', statusEffectiveFrom: fromToday(-5), statusNote: 'Light work' });
    const inForce = await clin.get(`${w.base}/athletes/${athleteId}/in-force`);
    expect(inForce.body).toMatchObject({ status: 'limited', statusEffectiveFrom: fromToday(-5) });
    expect((await clin.get(`${w.base}/athletes/${athleteId}/in-force?date=${fromToday(-7)}`)).body.status).toBe('out');
    expect((await clin.get(`${w.base}/athletes/${athleteId}/in-force?date=${fromToday(5)}`)).body.status).toBe('full');
  });

  it('a status change with a stale case version → 409, and no status row is added (SECURITY item 32)', async () => {
    const w = await shared();
    const clin = await w.as('clinician');
    const { id } = await openCase(clin, w);
    await clin.patch(`${w.base}/cases/${id}`, { reviewDate: fromToday(3), version: 1 });
    const res = await clin.post(`${w.base}/cases/${id}/status`, { status: 'out', effectiveFrom: fromToday(0), version: 1 });
    expect(res.status).toBe(409);
    expect(await statusRows(id)).toBe(1);
  });

  it('caseload status is the status in force today, the most restrictive across open cases (Shrier 2015, BJSM 49:1311–1315)', async () => {
    const w = await shared();
    const athleteId = await freshAthlete(w);
    const clin = await w.as('clinician');
    const a = await openCase(clin, w, { athleteId, status: 'limited', statusEffectiveFrom: fromToday(-3) });
    const b = await openCase(clin, w, { athleteId, bodyRegions: ['knee_left'], status: 'out', statusEffectiveFrom: fromToday(-1) });
    const row = async () => {
      const res = await clin.get(`${w.base}/caseload`);
      expect(res.status).toBe(200);
      // Only athletes on the clinician's care team are on their caseload (SECURITY item 14).
      expect(res.body.map((r: { athleteId: string }) => r.athleteId)).not.toContain(w.org.otherAthlete.membershipId);
      return res.body.find((r: { athleteId: string }) => r.athleteId === athleteId);
    };
    expect(await row()).toMatchObject({ status: 'out', statusEffectiveFrom: fromToday(-1), openCaseCount: 2, isMinor: true });

    expect((await clin.post(`${w.base}/cases/${b.id}/status`, { status: 'full', effectiveFrom: fromToday(0), version: 1 })).status).toBe(
      201,
    );
    expect(await row()).toMatchObject({ status: 'limited', statusEffectiveFrom: fromToday(-3), openCaseCount: 2 });

    // A change that starts tomorrow does not count today.
    expect((await clin.post(`${w.base}/cases/${a.id}/status`, { status: 'out', effectiveFrom: fromToday(1), version: 1 })).status).toBe(
      201,
    );
    expect((await row()).status).toBe('limited');

    expect((await clin.post(`${w.base}/cases/${a.id}/close`, { closedOn: fromToday(0), version: 2 })).status).toBe(200);
    expect(await row()).toMatchObject({ status: 'full', openCaseCount: 1 });

    const otherRows = (await (await w.as('otherClinician')).get(`${w.base}/caseload`)).body;
    expect(otherRows).toEqual([expect.objectContaining({ athleteId: w.org.otherAthlete.membershipId, status: 'full', openCaseCount: 0 })]);
  });
});

describe('closing a case', () => {
  it('removes its plan from what is in force; a second close or an edit afterwards → 409', async () => {
    const w = await shared();
    const athleteId = await freshAthlete(w);
    const clin = await w.as('clinician');
    const { id } = await openCase(clin, w, { athleteId });
    const plan = await clin.post(`${w.base}/cases/${id}/plan`, {
      stages: [{ id: randomUUID(), startDate: fromToday(-1), endDate: fromToday(30), patterns: { hinge: { mode: 'blocked' } } }],
    });
    expect(plan.status, JSON.stringify(plan.body)).toBe(201);
    const inForce = () => clin.get(`${w.base}/athletes/${athleteId}/in-force`);
    expect((await inForce()).body).toMatchObject({ restricted: true, patterns: { hinge: { mode: 'blocked' } } });

    const closed = await clin.post(`${w.base}/cases/${id}/close`, { closedOn: fromToday(0), closingNote: 'Resolved', version: 1 });
    expect(closed.status, JSON.stringify(closed.body)).toBe(200);
    expect((await inForce()).body).toMatchObject({ restricted: false, stages: [], status: 'full', patterns: { hinge: { mode: 'free' } } });

    expect((await clin.post(`${w.base}/cases/${id}/close`, { closedOn: fromToday(0), version: 2 })).status).toBe(409);
    expect((await clin.patch(`${w.base}/cases/${id}`, { reviewDate: fromToday(3), version: 2 })).status).toBe(409);
    expect((await clin.post(`${w.base}/cases/${id}/status`, { status: 'out', effectiveFrom: fromToday(0), version: 2 })).status).toBe(409);
  });

  it('a closing date before the onset → 400 naming closedOn (common practice)', async () => {
    const w = await shared();
    const clin = await w.as('clinician');
    const { id } = await openCase(clin, w);
    const res = await clin.post(`${w.base}/cases/${id}/close`, { closedOn: fromToday(-21), version: 1 });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['closedOn']);
    expect((await caseRow(id)).closed_on).toBeNull();
  });
});

describe('the audit trail of a case (SECURITY item 27)', () => {
  it('case.opened, case.updated, status.changed and case.closed carry the athlete and never the clinical text', async () => {
    const w = await shared();
    const athleteId = await freshAthlete(w);
    const clin = await w.as('clinician');
    const DIAGNOSIS = `Stress reaction ${randomUUID()}`;
    const NOTES = `Night pain reported ${randomUUID()}`;
    const DIAGNOSIS2 = `Pars stress fracture ${randomUUID()}`;
    const NOTES2 = `MRI ordered ${randomUUID()}`;
    const { id } = await openCase(clin, w, { athleteId, diagnosis: DIAGNOSIS, clinicalNotes: NOTES });
    expect((await clin.patch(`${w.base}/cases/${id}`, { diagnosis: DIAGNOSIS2, clinicalNotes: NOTES2, version: 1 })).status).toBe(200);
    expect(
      (await clin.post(`${w.base}/cases/${id}/status`, { status: 'out', effectiveFrom: fromToday(0), note: 'Rest this week', version: 2 }))
        .status,
    ).toBe(201);
    expect((await clin.post(`${w.base}/cases/${id}/close`, { closedOn: fromToday(0), closingNote: 'Resolved', version: 3 })).status).toBe(
      200,
    );

    const rows: { action: string; athlete_id: string; actor_user_id: string; before: unknown; after: unknown }[] = await h.ds.query(
      'SELECT action, athlete_id, actor_user_id, before, after FROM audit_entries WHERE organization_id = $1 AND athlete_id = $2 ORDER BY id',
      [w.org.id, athleteId],
    );
    // Opening writes the first status through the same status command as every later change.
    expect(rows.map((r) => r.action)).toEqual(['case.opened', 'status.changed', 'case.updated', 'status.changed', 'case.closed']);
    for (const r of rows) expect(r).toMatchObject({ athlete_id: athleteId, actor_user_id: w.org.clinician.userId });
    // Nothing about this case was written without the athlete: every entry naming the case is above.
    const bySubject = await h.ds.query('SELECT count(*) FROM audit_entries WHERE subject_id = $1 AND athlete_id IS DISTINCT FROM $2', [
      id,
      athleteId,
    ]);
    expect(Number(bySubject[0].count)).toBe(0);
    const text = JSON.stringify(rows);
    for (const secret of [DIAGNOSIS, NOTES, DIAGNOSIS2, NOTES2]) expect(text).not.toContain(secret);
    // That the text changed is still recorded, with its length only.
    expect(rows[1].before).toBeNull();
    expect(rows[1].after).toEqual({
      caseId: id,
      status: 'limited',
      effectiveFrom: fromToday(-19),
      note: 'Light work only',
      reason: 'first status of a new case',
    });
    expect(rows[2].before).toMatchObject({
      diagnosis: `[redacted: ${DIAGNOSIS.length} characters]`,
      clinicalNotes: `[redacted: ${NOTES.length} characters]`,
    });
    expect(rows[2].after).toMatchObject({ clinicalNotes: `[redacted: ${NOTES2.length} characters]` });
    expect(rows[3].before).toEqual({ status: 'limited', effectiveFrom: fromToday(-19) });
    expect(rows[3].after).toEqual({
      caseId: id,
      status: 'out',
      effectiveFrom: fromToday(0),
      note: 'Rest this week',
      reason: 'set by the clinician',
    });

    // The same through the API the clinician browses.
    const api = await clin.get(`${w.base}/audit?athleteId=${athleteId}`);
    expect(api.status).toBe(200);
    expect(api.body.entries.map((e: { action: string }) => e.action)).toEqual([
      'case.closed',
      'status.changed',
      'case.updated',
      'status.changed',
      'case.opened',
    ]);
    for (const secret of [DIAGNOSIS, NOTES, DIAGNOSIS2, NOTES2]) expect(JSON.stringify(api.body)).not.toContain(secret);
  });
});
