import { beforeAll, describe, expect, it } from 'vitest';
import { signedIn, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD } from '../../test/factories';
import { planWorld, put, twoStages, type World } from '../../test/worlds/plan-world';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { world, openCase, newPlan, versionRows } = planWorld(h);

describe('who may see a plan (policies/access/restriction-plan.ts; ASVS 5.0 V8.2.2)', () => {
  let w: World;
  let planId: string;
  const athletePath = () => `${w.base}/athletes/${w.org.athlete.membershipId}/in-force?date=2026-01-10`;

  beforeAll(async () => {
    w = await world();
    planId = (await newPlan(w, await openCase(w))).id;
  });

  it.each(['athlete', 'guardian'] as const)('%s: the current plan and what is in force, but no earlier versions (404)', async (who) => {
    const c = await w.as(who);
    const plan = await c.get(`${w.base}/plans/${planId}`);
    expect(plan.status).toBe(200);
    expect(plan.body).toMatchObject({ id: planId, version: 1, canSeeHistory: false });
    expect(plan.body.current.stages).toHaveLength(2);
    expect((await c.get(athletePath())).status).toBe(200);
    expect((await c.get(`${w.base}/plans/${planId}/versions`)).status).toBe(404);
    expect((await c.get(`${w.base}/plans/${planId}/versions/1`)).status).toBe(404);
  });

  it('the coach on the care team: current and history, but may not save', async () => {
    const c = await w.as('coach');
    expect((await c.get(`${w.base}/plans/${planId}`)).body.canSeeHistory).toBe(true);
    expect((await c.get(`${w.base}/plans/${planId}/versions`)).status).toBe(200);
    const save = await put(c, `${w.base}/plans/${planId}`, { version: 1, stages: twoStages(), guidance: 'Coach edit' });
    expect(save.status).toBe(403);
    expect(await versionRows(planId)).toEqual([1]);
  });

  // Admins hold no plan rule at all, so the route refuses before any record is loaded: 403 with the
  // role's reason, which says nothing about whether this plan exists (ASVS 5.0 V8.2.2 is met).
  it('admin: refused on the plan, its versions and what is in force (admins see none of it)', async () => {
    const c = await w.as('admin');
    for (const path of [`${w.base}/plans/${planId}`, `${w.base}/plans/${planId}/versions`, athletePath()]) {
      const res = await c.get(path);
      expect(res.status, path).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
      expect(JSON.stringify(res.body)).not.toContain('Protect');
    }
  });

  it.each(['otherCoach', 'otherClinician'] as const)(
    '%s of another care team: 404 on the plan, its versions and what is in force; may not save',
    async (who) => {
      const c = await w.as(who);
      for (const path of [
        `${w.base}/plans/${planId}`,
        `${w.base}/plans/${planId}/versions`,
        `${w.base}/plans/${planId}/versions/1`,
        athletePath(),
      ]) {
        expect((await c.get(path)).status, path).toBe(404);
      }
      const save = await put(c, `${w.base}/plans/${planId}`, { version: 1, stages: twoStages(), guidance: 'Not mine' });
      expect([403, 404]).toContain(save.status);
      expect(await versionRows(planId)).toEqual([1]);
    },
  );

  it("another organization's clinician: 404 through their own organization", async () => {
    const other = await createOrg(h.ds);
    const c = await signedIn(h.app, other.clinician.email, TEST_PASSWORD);
    expect((await c.get(`/api/orgs/${other.id}/plans/${planId}`)).status).toBe(404);
    expect((await c.get(`${w.base}/plans/${planId}`)).status).toBe(404);
  });
});
