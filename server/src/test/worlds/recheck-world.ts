import { expect } from 'vitest';
import { randomUUID } from 'node:crypto';
import { signedIn, type Harness } from '../harness';
import { TEST_PASSWORD } from '../factories';
import { addDays, createOrg, put, TODAY } from './test-world';

/** The re-check tests' world (recheck.test.ts, recheck-weekly.test.ts): one athlete, their coach and clinician, one program. */

export const oneSet = (exerciseId: string, kg: number) => ({
  exercises: [{ id: randomUUID(), exerciseId, sets: [{ id: randomUUID(), reps: 5, load: { kind: 'kg', value: kg }, targetRpe: 6 }] }],
});

export type RecheckWorld = Awaited<ReturnType<typeof recheckWorld>>;

/** A deadlift of 140 kg tested today; a case; optionally a plan capping the hinge at `pct`% of 1RM. */
export async function recheckWorld(h: Harness, pct: number | null) {
  const as = (m: { email: string }) => signedIn(h.app, m.email, TEST_PASSWORD);
  const org = await createOrg(h.ds);
  const [coach, clinician] = await Promise.all([as(org.coach), as(org.clinician)]);
  const base = `/api/orgs/${org.id}`;
  const athlete = org.athlete.membershipId;
  const dl = ((await coach.get(`${base}/exercises`)).body as { id: string; name: string }[]).find((e) => e.name === 'Deadlift')!.id;
  const baseline = async (kg: number) =>
    expect(
      (
        await coach.post(`${base}/athletes/${athlete}/baselines`, {
          exerciseId: dl,
          kind: 'tested',
          loadKg: kg,
          reps: 1,
          testedOn: TODAY,
        })
      ).status,
    ).toBe(201);
  await baseline(140);
  const c = await clinician.post(`${base}/cases`, {
    athleteId: athlete,
    bodyRegions: ['lower_back'],
    onsetDate: addDays(TODAY, -30),
    status: 'limited',
    statusEffectiveFrom: addDays(TODAY, -30),
  });
  expect(c.status).toBe(201);
  const stages = (p: number) => [
    {
      id: randomUUID(),
      startDate: addDays(TODAY, -30),
      endDate: addDays(TODAY, 120),
      painCeiling: 5,
      patterns: { hinge: { mode: 'capped', caps: { maxPercent1RM: p } } },
    },
  ];
  let planId = '';
  let planVersion = 0;
  if (pct !== null) {
    const plan = await clinician.post(`${base}/cases/${c.body.id}/plan`, { stages: stages(pct), guidance: '' });
    expect(plan.status).toBe(201);
    planId = plan.body.id;
    planVersion = plan.body.version;
  }
  const revisePlan = async (p: number) => {
    const res = await put(clinician, `${base}/plans/${planId}`, { version: planVersion, stages: stages(p), guidance: '' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    planVersion = res.body.version;
  };
  const prog = await coach.post(`${base}/programs`, { name: 'Block', athleteIds: [athlete] });
  /** A session, published unless `draft`. */
  const session = async (date: string, kg: number, draft = false) => {
    const s = await coach.post(`${base}/programs/${prog.body.id}/sessions`, { date, title: `${date} ${kg}`, content: oneSet(dl, kg) });
    expect(s.status).toBe(201);
    if (draft) return s.body.id as string;
    const pub = await coach.post(`${base}/sessions/${s.body.id}/publish`, { version: s.body.version });
    expect(pub.status, JSON.stringify(pub.body)).toBe(200);
    return s.body.id as string;
  };
  const held = async () =>
    (
      (await h.ds.query(`SELECT session_id FROM session_holds WHERE athlete_id = $1 ORDER BY session_id`, [athlete])) as {
        session_id: string;
      }[]
    ).map((r) => r.session_id);
  const notices = async (kind = 'sessions_on_hold') =>
    (await h.ds.query(
      `SELECT recipient_id, athlete_id, severity, title, body FROM notifications WHERE organization_id = $1 AND kind = $2 ORDER BY created_at`,
      [org.id, kind],
    )) as { recipient_id: string; athlete_id: string; severity: string; title: string; body: string }[];
  return {
    org,
    coach,
    clinician,
    base,
    athlete,
    dl,
    baseline,
    caseId: c.body.id as string,
    caseVersion: c.body.version as number,
    revisePlan,
    program: prog.body.id as string,
    session,
    held,
    notices,
  };
}
