import { describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { useHarness, signedIn } from '../../test/harness';
import { createOrg, TEST_PASSWORD } from '../../test/factories';

describe('cases and plans smoke', () => {
  const h = useHarness();
  it('clinician opens a case, writes a plan; coach sees caps but not notes', async () => {
    const org = await createOrg(h.ds);
    const clin = await signedIn(h.app, org.clinician.email, TEST_PASSWORD);
    const base = `/api/orgs/${org.id}`;
    const created = await clin.post(`${base}/cases`, {
      athleteId: org.athlete.membershipId, bodyRegions: ['lower_back'], onsetDate: '2026-11-20', diagnosis: 'Lumbar strain',
      clinicalNotes: 'Secret note', status: 'limited', statusEffectiveFrom: '2026-11-21', reviewDate: '2026-12-15',
    });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const caseId = created.body.id;
    const stage = (start: string, end: string, pct: number) => ({
      id: randomUUID(), startDate: start, endDate: end, painCeiling: 4,
      patterns: { hinge: { mode: 'capped', caps: { maxPercent1RM: pct, maxRpe: 7 } }, jump: { mode: 'blocked' } },
    });
    const plan = await clin.post(`${base}/cases/${caseId}/plan`, { stages: [stage('2026-11-21', '2026-12-05', 60), stage('2026-12-06', '2026-12-31', 75)], guidance: 'Easy does it' });
    expect(plan.status, JSON.stringify(plan.body)).toBe(201);
    const inForce = await clin.get(`${base}/athletes/${org.athlete.membershipId}/in-force?date=2026-12-06`);
    expect(inForce.status, JSON.stringify(inForce.body)).toBe(200);
    expect(inForce.body.patterns.hinge).toEqual({ mode: 'capped', caps: { maxPercent1RM: 75, maxRpe: 7 } });
    const upd = await clin.agent.put(`${base}/plans/${plan.body.id}`).set('x-csrf-token', clin.csrf).send({ version: 1, stages: [stage('2026-11-21', '2026-12-31', 50)], guidance: 'x' });
    expect(upd.status, JSON.stringify(upd.body)).toBe(200);
    const stale = await clin.agent.put(`${base}/plans/${plan.body.id}`).set('x-csrf-token', clin.csrf).send({ version: 1, stages: [stage('2026-11-21', '2026-12-31', 50)], guidance: 'x' });
    expect(stale.status).toBe(409);
    const coach = await signedIn(h.app, org.coach.email, TEST_PASSWORD);
    const seen = await coach.get(`${base}/cases/${caseId}`);
    expect(seen.status).toBe(200);
    expect(seen.body.clinicalNotes).toBeUndefined();
    expect(seen.body.diagnosis).toBeUndefined();
    const versions = await coach.get(`${base}/plans/${plan.body.id}/versions`);
    expect(versions.body.map((v: { version: number }) => v.version)).toEqual([2, 1]);
    const caseload = await clin.get(`${base}/caseload`);
    expect(caseload.body).toHaveLength(1);
    expect(caseload.body[0].status).toBe('limited');
    const audit = await clin.get(`${base}/audit`);
    expect(audit.status).toBe(200);
    expect(audit.body.entries.map((e: { action: string }) => e.action)).toContain('plan.revised');
    expect(JSON.stringify(audit.body)).not.toContain('Secret note');
  });
});
