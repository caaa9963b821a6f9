import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { useHarness } from '../../test/harness';
import { createOrg } from '../../test/factories';
import { caseWorld, fromToday, openCase } from '../../test/worlds/case-world';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { shared, freshAthlete, caseRow, statusRows } = caseWorld(h);

describe('editing a case', () => {
  it('PATCH with a stale version → 409 and the first edit stands (optimistic locking; RFC 9110 §15.5.10 409 Conflict)', async () => {
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

  it('PATCH carrying organizationId, athleteId or role → 400 and nothing changes (ASVS 5.0 V8.2.3)', async () => {
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

  it('a coach trying to write a diagnosis → 403 and nothing changes (ASVS 5.0 V8.2.3)', async () => {
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

  it('a status change with a stale case version → 409, and no status row is added (optimistic locking; RFC 9110 §15.5.10 409 Conflict)', async () => {
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
      // Only athletes on the clinician's care team are on their caseload (ASVS 5.0 V8.2.2).
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

describe('the audit trail of a case (45 CFR 164.312(b); ASVS 5.0 V16.2)', () => {
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
