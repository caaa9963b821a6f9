import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { TrainingLog } from '../../entities';
import { useHarness } from '../../test/harness';
import { planWorld, type World } from '../../test/worlds/plan-world';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
// The clock is pinned at 10 June 2026 (plan-world).
const { world, freshAthlete, openCase } = planWorld(h);

const ids = { painSettled: randomUUID(), judgement: randomUUID(), ready: randomUUID() };

/** Three stages of 14 days; stage 1 (1–14 June) is in force on 10 June and carries one criterion of each kind. */
function threeStages() {
  const blank = { painCeiling: 3, patterns: { jump: { mode: 'blocked' } } };
  return [
    {
      id: randomUUID(),
      label: 'Settle',
      startDate: '2026-06-01',
      endDate: '2026-06-14',
      ...blank,
      criteria: [
        { id: ids.painSettled, kind: 'record', rule: 'pain_settled_sessions', count: 2, maxPain: 2 },
        { id: ids.judgement, kind: 'clinician', label: 'Bends forward without guarding', measure: 'yes_no' },
        { id: ids.ready, kind: 'athlete', threshold: 7 },
      ],
    },
    { id: randomUUID(), label: 'Build', startDate: '2026-06-15', endDate: '2026-06-28', ...blank },
    { id: randomUUID(), label: 'Return', startDate: '2026-06-29', endDate: '2026-07-12', painCeiling: 3, patterns: {} },
  ];
}

async function planWithCriteria(w: World, athleteId?: string) {
  const caseId = await openCase(w, athleteId);
  const stages = threeStages();
  const res = await (await w.as('clinician')).post(`${w.base}/cases/${caseId}/plan`, { stages, guidance: 'Step by step' });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return { planId: res.body.id as string, stages };
}

async function logSession(w: World, athleteId: string, date: string, painBefore: number, painDuring: number, painNextMorning: number) {
  await h.ds.getRepository(TrainingLog).save({
    organizationId: w.org.id,
    athleteId,
    date,
    durationMinutes: 45,
    sessionRpe: 4,
    painBefore,
    painDuring,
    painNextMorning,
    painCeiling: 3,
    sets: [],
  });
}

describe('stage criteria on a plan (criteria-based progression, Bern consensus)', () => {
  it('the clinician sees each criterion with its evidence; when all are met, the prompt to move on (never a move by itself)', async () => {
    const w = await world();
    const athleteId = await freshAthlete(w);
    const { planId, stages } = await planWithCriteria(w, athleteId);
    const clin = await w.as('clinician');
    const url = `${w.base}/plans/${planId}/stage-criteria`;

    let view = (await clin.get(url)).body;
    expect(view.stage).toMatchObject({ id: stages[0].id, number: 1, of: 3 });
    expect(view.nextStage).toMatchObject({ id: stages[1].id, number: 2 });
    expect(view.criteria.map((c: { result: { state: string } }) => c.result.state)).toEqual(['waiting', 'waiting', 'waiting']);
    expect(view.promptToMove).toBe(false);

    // Silbernagel et al. 2007 (AJSM 35:897–906): pain during ≤ ceiling and next morning not above before.
    await logSession(w, athleteId, '2026-06-05', 1, 2, 1);
    await logSession(w, athleteId, '2026-06-08', 1, 1, 0);
    const assessed = await clin.post(`${w.base}/plans/${planId}/stage-assessments`, {
      stageId: stages[0].id,
      criterionId: ids.judgement,
      date: '2026-06-09',
      met: true,
      note: 'Moves freely',
    });
    expect(assessed.status, JSON.stringify(assessed.body)).toBe(201);
    view = assessed.body;
    expect(view.criteria.map((c: { result: { state: string } }) => c.result.state)).toEqual(['met', 'met', 'waiting']);
    expect(view.criteria[1].result.evidence).toContain('Moves freely');
    expect(view.promptToMove).toBe(false);
    expect(view.metCount).toBe(2);
    expect(view.allMet).toBe(false);

    // The plan is unchanged: criteria never move a stage.
    expect((await clin.get(`${w.base}/plans/${planId}`)).body.version).toBe(1);
  });

  it('the athlete rates readiness; athlete and guardian read plain words without the evidence; the clinician is then prompted', async () => {
    const w = await world();
    const { planId, stages } = await planWithCriteria(w);
    const athleteId = w.org.athlete.membershipId;
    await logSession(w, athleteId, '2026-06-05', 1, 2, 1);
    await logSession(w, athleteId, '2026-06-08', 1, 1, 0);
    const clin = await w.as('clinician');
    await clin.post(`${w.base}/plans/${planId}/stage-assessments`, {
      stageId: stages[0].id,
      criterionId: ids.judgement,
      date: '2026-06-09',
      met: true,
      note: 'Private',
    });

    const athlete = await w.as('athlete');
    const rated = await athlete.post(`${w.base}/plans/${planId}/readiness`, { stageId: stages[0].id, value: 8 });
    expect(rated.status, JSON.stringify(rated.body)).toBe(201);
    expect(rated.body).toMatchObject({ allMet: true, promptToMove: false, canAssess: false, canRate: true, decisions: [] });
    expect(rated.body.criteria.every((c: { result: { evidence: string } }) => c.result.evidence === '')).toBe(true);
    expect(rated.body.criteria[0].plain).toMatch(/2 training days in a row/);
    expect(rated.body.criteria[0].plainProgress).toBe('Done.');

    const guardian = (await (await w.as('guardian')).get(`${w.base}/plans/${planId}/stage-criteria`)).body;
    expect(guardian.criteria.map((c: { plain: string }) => c.plain)).toHaveLength(3);
    expect(JSON.stringify(guardian)).not.toContain('Private');
    expect(guardian.canRate).toBe(false);

    const forClinician = (await clin.get(`${w.base}/plans/${planId}/stage-criteria`)).body;
    expect(forClinician).toMatchObject({ allMet: true, promptToMove: true });
    expect(forClinician.criteria[2].result.evidence).toBe('readiness 8/10 on 2026-06-10 (needs ≥ 7)');

    const audit = await h.ds.query(`SELECT action FROM audit_entries WHERE subject_id = $1 AND action LIKE 'stage.%' ORDER BY id`, [
      planId,
    ]);
    expect(audit.map((a: { action: string }) => a.action)).toEqual(['stage.assessed', 'stage.readiness_rated']);
  });

  it('refusals: the athlete may not assess, the guardian and coach may not rate, bad input names the field', async () => {
    const w = await world();
    const athleteId = await freshAthlete(w);
    const { planId, stages } = await planWithCriteria(w, athleteId);
    const clin = await w.as('clinician');
    const assess = (body: object) => clin.post(`${w.base}/plans/${planId}/stage-assessments`, body);
    expect(
      (await assess({ stageId: stages[0].id, criterionId: ids.ready, date: '2026-06-09', value: 8 })).body.error.fields,
    ).toHaveProperty('criterionId');
    expect(
      (await assess({ stageId: stages[0].id, criterionId: ids.judgement, date: '2026-06-11', met: true })).body.error.fields,
    ).toHaveProperty('date');
    expect(
      (await assess({ stageId: stages[0].id, criterionId: ids.judgement, date: '2026-06-09', value: 3 })).body.error.fields,
    ).toHaveProperty('met');
    expect((await assess({ stageId: randomUUID(), criterionId: ids.judgement, date: '2026-06-09', met: true })).status).toBe(400);
    expect((await (await w.as('coach')).post(`${w.base}/plans/${planId}/readiness`, { stageId: stages[0].id, value: 8 })).status).toBe(403);
    expect((await (await w.as('guardian')).post(`${w.base}/plans/${planId}/readiness`, { stageId: stages[0].id, value: 8 })).status).toBe(
      403,
    );
    expect(
      (
        await (
          await w.as('athlete')
        ).post(`${w.base}/plans/${planId}/stage-assessments`, {
          stageId: stages[0].id,
          criterionId: ids.judgement,
          date: '2026-06-09',
          met: true,
        })
      ).status,
    ).toBe(403);
    expect(
      (await (await w.as('athlete')).post(`${w.base}/plans/${planId}/readiness`, { stageId: stages[0].id, value: 11 })).body.error.fields,
    ).toHaveProperty('value');
  });

  it('moving on early is a new plan version with the decision, who agreed and the days early, audited; a stale version is 409', async () => {
    const w = await world();
    const athleteId = await freshAthlete(w);
    const { planId, stages } = await planWithCriteria(w, athleteId);
    const clin = await w.as('clinician');
    const advance = (body: object) => clin.post(`${w.base}/plans/${planId}/advance`, body);
    const ok = {
      fromStageId: stages[0].id,
      effectiveDate: '2026-06-11',
      agreedBy: ['athlete', 'guardian'],
      note: 'Talked it through',
      version: 1,
    };

    expect((await advance({ ...ok, agreedBy: [] })).body.error.fields).toHaveProperty('agreedBy');
    expect((await advance({ ...ok, effectiveDate: '2026-06-09' })).body.error.fields).toHaveProperty('effectiveDate');
    expect((await advance({ ...ok, fromStageId: stages[2].id })).body.error.fields).toHaveProperty('fromStageId');
    expect((await advance({ ...ok, version: 7 })).status).toBe(409);
    expect((await (await w.as('coach')).post(`${w.base}/plans/${planId}/advance`, ok)).status).toBe(403);

    const res = await advance(ok);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.planVersion).toBe(2);
    expect(res.body.decisions[0]).toMatchObject({
      fromStageId: stages[0].id,
      toStageId: stages[1].id,
      effectiveDate: '2026-06-11',
      plannedDate: '2026-06-15',
      daysEarly: 4,
      agreedBy: ['athlete', 'guardian'],
      criteriaMet: 0,
      criteriaTotal: 3,
      note: 'Talked it through',
      decidedByName: w.org.clinician.name,
    });
    const plan = (await clin.get(`${w.base}/plans/${planId}`)).body;
    expect(plan.current.stages.map((s: { startDate: string; endDate: string }) => [s.startDate, s.endDate])).toEqual([
      ['2026-06-01', '2026-06-10'],
      ['2026-06-11', '2026-06-24'],
      ['2026-06-25', '2026-07-08'],
    ]);
    expect(plan.current.changeNote).toMatch(/\(4 days earlier than planned\); agreed with athlete, guardian/);
    const audit = await h.ds.query(
      `SELECT action, after FROM audit_entries WHERE subject_id = $1 AND action IN ('stage.advanced', 'plan.revised') ORDER BY id`,
      [planId],
    );
    expect(audit.map((a: { action: string }) => a.action)).toEqual(['plan.revised', 'stage.advanced']);
    expect(audit[1].after).toMatchObject({ daysEarly: 4, agreedBy: ['athlete', 'guardian'], version: 2 });
  });

  it('moving on later than the dates works too (daysEarly −2), and the later stages keep their lengths', async () => {
    const w = await world();
    const athleteId = await freshAthlete(w);
    const { planId, stages } = await planWithCriteria(w, athleteId);
    const res = await (
      await w.as('clinician')
    ).post(`${w.base}/plans/${planId}/advance`, {
      fromStageId: stages[0].id,
      effectiveDate: '2026-06-17',
      agreedBy: ['athlete'],
      version: 1,
    });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.decisions[0]).toMatchObject({ daysEarly: -2, plannedDate: '2026-06-15' });
    const plan = (await (await w.as('clinician')).get(`${w.base}/plans/${planId}`)).body;
    expect(plan.current.stages[0].endDate).toBe('2026-06-16');
    expect(plan.current.stages[2]).toMatchObject({ startDate: '2026-07-01', endDate: '2026-07-14' });
  });
});
