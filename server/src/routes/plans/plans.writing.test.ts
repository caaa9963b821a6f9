import { beforeAll, describe, expect, it } from 'vitest';
import { RestrictionPlan } from '../../entities';
import { useHarness } from '../../test/harness';
import { planWorld, put, twoStages, type World } from '../../test/worlds/plan-world';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { world, freshAthlete, openCase, newPlan, versionRows } = planWorld(h);

describe('writing a plan', () => {
  it('a two-stage plan is version 1, with the default pain ceiling filled in (Silbernagel et al. 2007, AJSM 35:897–906: 5)', async () => {
    const w = await world();
    const caseId = await openCase(w);
    const { id, stages, body } = await newPlan(w, caseId);
    expect(body).toMatchObject({
      caseId,
      athleteId: w.org.athlete.membershipId,
      organizationId: w.org.id,
      version: 1,
      canSeeHistory: true,
    });
    expect(body.current).toMatchObject({
      planId: id,
      version: 1,
      guidance: 'Keep the back happy',
      createdByName: w.org.clinician.name,
      changeNote: null,
    });
    expect(body.current.stages).toEqual([stages[0], { ...stages[1], painCeiling: 5 }]);
    expect((await (await w.as('clinician')).get(`${w.base}/cases/${caseId}`)).body.planId).toBe(id);
  });

  it('overlapping stages → 400 naming the stage path, on create and on save; nothing stored (HL7 FHIR R4: a date-only end is inclusive)', async () => {
    const w = await world();
    const clin = await w.as('clinician');
    const caseId = await openCase(w);
    const stages = twoStages();
    stages[1].startDate = '2026-01-18';
    const res = await clin.post(`${w.base}/cases/${caseId}/plan`, { stages });
    expect(res.status).toBe(400);
    expect(res.body.error.fields['stages.1.startDate']).toEqual([expect.stringMatching(/overlaps stage 1/)]);
    expect(await h.ds.getRepository(RestrictionPlan).countBy({ caseId })).toBe(0);

    const plan = await newPlan(w, caseId);
    const save = await put(clin, `${w.base}/plans/${plan.id}`, { version: 1, stages, guidance: '' });
    expect(save.status).toBe(400);
    expect(Object.keys(save.body.error.fields)).toEqual(['stages.1.startDate']);
    expect(await versionRows(plan.id)).toEqual([1]);
  });

  it('a second plan on the same case → 409; the first stays the only one (common practice: one plan per case, revised by versions)', async () => {
    const w = await world();
    const caseId = await openCase(w);
    const first = await newPlan(w, caseId);
    const res = await (await w.as('clinician')).post(`${w.base}/cases/${caseId}/plan`, { stages: twoStages() });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('conflict');
    const plans = await h.ds.getRepository(RestrictionPlan).findBy({ caseId });
    expect(plans.map((p) => p.id)).toEqual([first.id]);
  });
});

describe('what is in force on a date', () => {
  let w: World;
  let athleteId: string;
  let planId: string;

  beforeAll(async () => {
    w = await world();
    athleteId = await freshAthlete(w);
    planId = (await newPlan(w, await openCase(w, athleteId))).id;
  });

  const inForce = async (date: string) => {
    const res = await (await w.as('clinician')).get(`${w.base}/athletes/${athleteId}/in-force?date=${date}`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    return res.body;
  };

  it("inside stage 1: its caps, its pain ceiling and the plan's guidance", async () => {
    const f = await inForce('2026-01-10');
    expect(
      f.stages.map((s: { planId: string; planVersion: number; stage: { label: string } }) => [s.planId, s.planVersion, s.stage.label]),
    ).toEqual([[planId, 1, 'Protect']]);
    expect(f.patterns.hinge).toEqual({ mode: 'capped', caps: { maxPercent1RM: 60, maxRpe: 7 } });
    expect(f.patterns.jump).toEqual({ mode: 'blocked' });
    expect(f.patterns.squat).toEqual({ mode: 'free' });
    expect(f).toMatchObject({ date: '2026-01-10', athleteId, painCeiling: 3, restricted: true, guidance: ['Keep the back happy'] });
  });

  it("on stage 1's end date: still stage 1 (HL7 FHIR R4: a date-only end is inclusive)", async () => {
    const f = await inForce('2026-01-18');
    expect(f.stages.map((s: { stage: { label: string } }) => s.stage.label)).toEqual(['Protect']);
    expect(f.patterns.jump).toEqual({ mode: 'blocked' });
  });

  it('in the gap between stages: nothing in force, default pain ceiling 5 (Silbernagel et al. 2007, AJSM 35:897–906)', async () => {
    const f = await inForce('2026-01-20');
    expect(f).toMatchObject({ stages: [], restricted: false, painCeiling: 5, guidance: [] });
    expect(f.patterns.hinge).toEqual({ mode: 'free' });
  });

  it('stage 2 on its first day, and nothing after the plan ends (HL7 FHIR R4: inclusive dates)', async () => {
    const s2 = await inForce('2026-01-25');
    expect(s2.patterns.hinge).toEqual({ mode: 'capped', caps: { maxPercent1RM: 80 } });
    expect(s2.patterns.jump).toEqual({ mode: 'capped', caps: { maxSetsPerSession: 3, impactAllowed: false } });
    expect(s2.painCeiling).toBe(5);
    const after = await inForce('2026-02-08');
    expect(after).toMatchObject({ stages: [], restricted: false });
  });

  it('a date that is not a calendar date → 400 (HL7 FHIR R4 date)', async () => {
    const res = await (await w.as('clinician')).get(`${w.base}/athletes/${athleteId}/in-force?date=2026-02-30`);
    expect(res.status).toBe(400);
  });
});
