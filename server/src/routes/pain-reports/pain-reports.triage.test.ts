import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import type request from 'supertest';
import type { MemberRef } from '../../test/factories';
import { useHarness } from '../../test/harness';
import { EMERGENCY_NUMBER, fromToday, question, reportBody, reportWorld, TODAY, type World } from '../../test/worlds/report-world';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { world, freshAthlete, noticesAbout, flagsAbout, casesOf } = reportWorld(h);

describe('a routine report (no red flag) — NICE NG59: no flags → reassure, care team informed', () => {
  it('pain 8 with no flag → 201 routine, not Out; one notice each to the care-team clinicians and coach, none to anyone else (NICE NG59: pain 8 with no flag goes to the clinician, not an emergency)', async () => {
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
    // Pain 2 only: an emergency item routes as an emergency whatever the pain (NICE NG59).
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
      expect.objectContaining({ id: res.body.report.caseId, openedByName: null, status: 'out', statusEffectiveFrom: TODAY }),
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
    expect(inForce.body).toMatchObject({ status: 'out', statusEffectiveFrom: TODAY });
  });

  it('audit: pain_report.created, case.opened and status.changed, each naming the athlete, none holding the note (45 CFR 164.312(b); ASVS 5.0 V16.2)', async () => {
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
    expect(detail.body).toMatchObject({ status: 'out', statusEffectiveFrom: TODAY, version: 2 });
    expect(detail.body.statusHistory.map((s: { status: string }) => s.status)).toEqual(['out', 'limited']);
    const actions = (await h.ds.query('SELECT action FROM audit_entries WHERE request_id = $1 ORDER BY id', [rid])).map(
      (r: { action: string }) => r.action,
    );
    expect(actions).toEqual(['pain_report.created', 'status.changed']);
    // Emergency beats urgent: one emergency flag, no urgent one (NICE NG59).
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
