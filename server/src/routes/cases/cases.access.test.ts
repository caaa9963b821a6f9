import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { signedIn, useHarness, type Client } from '../../test/harness';
import { createOrg, TEST_PASSWORD, type TestOrg } from '../../test/factories';
import { caseBody, caseWorld, fromToday, openCase, type Who, type World } from '../../test/worlds/case-world';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { shared, caseRow, casesOf, statusRows } = caseWorld(h);

describe('who may do what with a case (ASVS 5.0 V8.1.1, V8.2.2, V8.4.1)', () => {
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
  // care team's record (ASVS 5.0 V8.2.2), so the record's existence is never revealed.
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

  it("another organization's clinician gets 404 on the case, through their own organization or ours (ASVS 5.0 V8.4.1)", async () => {
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

  it('signed out, the case routes answer 401 (ASVS 5.0 V8.2.1)', async () => {
    const anon = request(h.app);
    expect((await anon.get(`${w.base}/cases/${caseId}`)).status).toBe(401);
    expect((await anon.get(`${w.base}/cases`)).status).toBe(401);
    expect((await anon.get(`${w.base}/caseload`)).status).toBe(401);
  });

  it('none of the refused calls changed the case: one status, version 1, still open', async () => {
    expect(await statusRows(caseId)).toBe(1);
    expect(await caseRow(caseId)).toMatchObject({ version: 1, closed_on: null, review_date: fromToday(14) });
  });

  it('a clinician cannot open a case for an athlete outside their care team, even in their organization (ASVS 5.0 V8.2.2)', async () => {
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

describe('what each role sees of a case (ASVS 5.0 V8.2.3; 45 CFR 164.502(b) minimum necessary)', () => {
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
      'painReports',
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
      'painReports',
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
      'painReports',
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

  it('the clinical text itself never reaches coach, guardian or admin; notes never reach the athlete (ASVS 5.0 V8.2.3)', async () => {
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

  it("GET as the clinician writes a 'case.viewed' entry naming the case and athlete (45 CFR 164.312(b); ASVS 5.0 V16.2)", async () => {
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
