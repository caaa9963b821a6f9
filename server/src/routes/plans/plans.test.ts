import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import { todayIso } from '../../../../policies/roles';
import { CareTeamAssignment, RestrictionPlan, RestrictionPlanVersion } from '../../entities';
import { appendAudit } from '../../services/audit';
import { signedIn, useHarness, type Client } from '../../test/harness';
import { createMember, createOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../../test/factories';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

type Who = 'admin' | 'coach' | 'clinician' | 'clinician2' | 'athlete' | 'guardian' | 'otherCoach' | 'otherClinician';

interface World {
  org: TestOrg & { clinician2: MemberRef };
  base: string;
  as: (who: Who) => Promise<Client>;
}

/**
 * One organization for the file (each sign-in costs a bcrypt comparison): the factory's care team
 * plus a second clinician on it, and a second care team (otherCoach + otherClinician around
 * otherAthlete), so "same role, other care team" is someone with athletes of their own.
 */
async function makeWorld(): Promise<World> {
  const base = await createOrg(h.ds);
  const clinician2 = await createMember(h.ds, base.id, ['clinician']);
  await h.ds.getRepository(CareTeamAssignment).save([
    { organizationId: base.id, athleteId: base.athlete.membershipId, memberId: clinician2.membershipId, role: 'clinician' },
    { organizationId: base.id, athleteId: base.otherAthlete.membershipId, memberId: base.otherClinician.membershipId, role: 'clinician' },
    { organizationId: base.id, athleteId: base.otherAthlete.membershipId, memberId: base.otherCoach.membershipId, role: 'coach' },
  ]);
  const org = { ...base, clinician2 };
  const clients = new Map<Who, Promise<Client>>();
  const as = (who: Who) => {
    if (!clients.has(who)) clients.set(who, signedIn(h.app, (org[who] as MemberRef).email, TEST_PASSWORD));
    return clients.get(who)!;
  };
  return { org, base: `/api/orgs/${org.id}`, as };
}
let worldOnce: Promise<World> | null = null;
const world = () => (worldOnce ??= makeWorld());

/** An athlete of their own for a test that reads the athlete's whole picture (in-force). */
async function freshAthlete(w: World): Promise<string> {
  const a = await createMember(h.ds, w.org.id, ['athlete'], { dateOfBirth: '2009-05-01' });
  await h.ds
    .getRepository(CareTeamAssignment)
    .save({ organizationId: w.org.id, athleteId: a.membershipId, memberId: w.org.clinician.membershipId, role: 'clinician' });
  return a.membershipId;
}

const put = (c: Client, path: string, body: object) => c.agent.put(path).set('x-csrf-token', c.csrf).send(body);

/** Stage 1: 5–18 January 2026, stage 2: 25 January–7 February; a gap of six days between. */
const twoStages = () => [
  {
    id: randomUUID(),
    label: 'Protect',
    startDate: '2026-01-05',
    endDate: '2026-01-18',
    painCeiling: 3,
    patterns: { hinge: { mode: 'capped', caps: { maxPercent1RM: 60, maxRpe: 7 } }, jump: { mode: 'blocked' } },
  },
  {
    id: randomUUID(),
    label: 'Build',
    startDate: '2026-01-25',
    endDate: '2026-02-07',
    patterns: {
      hinge: { mode: 'capped', caps: { maxPercent1RM: 80 } },
      jump: { mode: 'capped', caps: { impactAllowed: false, maxSetsPerSession: 3 } },
    },
  },
];

async function openCase(w: World, athleteId = w.org.athlete.membershipId): Promise<string> {
  const res = await (
    await w.as('clinician')
  ).post(`${w.base}/cases`, {
    athleteId,
    bodyRegions: ['lower_back'],
    onsetDate: '2026-01-02',
    diagnosis: 'Lumbar strain',
    status: 'limited',
    statusEffectiveFrom: '2026-01-03',
  });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.id;
}

async function newPlan(w: World, caseId: string, stages = twoStages(), guidance = 'Keep the back happy') {
  const res = await (await w.as('clinician')).post(`${w.base}/cases/${caseId}/plan`, { stages, guidance });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return { id: res.body.id as string, stages, body: res.body };
}

const versionRows = async (planId: string): Promise<number[]> =>
  (await h.ds.query('SELECT version FROM restriction_plan_versions WHERE plan_id = $1 ORDER BY version', [planId])).map(
    (r: { version: number }) => r.version,
  );

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

  it('overlapping stages → 400 naming the stage path, on create and on save; nothing stored (REFERENCES §12: date-only ends are inclusive)', async () => {
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

  it("on stage 1's end date: still stage 1 (REFERENCES §12, HL7 FHIR R4: a date-only end is inclusive)", async () => {
    const f = await inForce('2026-01-18');
    expect(f.stages.map((s: { stage: { label: string } }) => s.stage.label)).toEqual(['Protect']);
    expect(f.patterns.jump).toEqual({ mode: 'blocked' });
  });

  it('in the gap between stages: nothing in force, default pain ceiling 5 (Silbernagel et al. 2007, AJSM 35:897–906)', async () => {
    const f = await inForce('2026-01-20');
    expect(f).toMatchObject({ stages: [], restricted: false, painCeiling: 5, guidance: [] });
    expect(f.patterns.hinge).toEqual({ mode: 'free' });
  });

  it('stage 2 on its first day, and nothing after the plan ends (REFERENCES §12, FHIR R4 inclusive dates)', async () => {
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

describe('versions and optimistic locking (SECURITY item 32)', () => {
  let w: World;
  let planId: string;
  let v1: ReturnType<typeof twoStages>;
  let v2: ReturnType<typeof twoStages>;
  let v3: ReturnType<typeof twoStages>;

  beforeAll(async () => {
    w = await world();
    const plan = await newPlan(w, await openCase(w));
    planId = plan.id;
    v1 = plan.stages;
    v2 = twoStages();
    v2[0].painCeiling = 2;
    v3 = twoStages();
    v3[1].endDate = '2026-02-21';
    const a = await put(await w.as('clinician'), `${w.base}/plans/${planId}`, {
      version: 1,
      stages: v2,
      guidance: 'Lower ceiling',
      changeNote: 'Flare-up',
    });
    expect(a.status, JSON.stringify(a.body)).toBe(200);
    expect(a.body.version).toBe(2);
    const b = await put(await w.as('clinician2'), `${w.base}/plans/${planId}`, {
      version: 2,
      stages: v3,
      guidance: 'Longer build',
      changeNote: 'Slow progress',
    });
    expect(b.status, JSON.stringify(b.body)).toBe(200);
  });

  it('the versions list is newest first, with who saved each (SECURITY item 27: who changed what)', async () => {
    const res = await (await w.as('clinician')).get(`${w.base}/plans/${planId}/versions`);
    expect(res.status).toBe(200);
    expect(
      res.body.map((v: { version: number; createdByName: string; changeNote: string | null }) => [
        v.version,
        v.createdByName,
        v.changeNote,
      ]),
    ).toEqual([
      [3, w.org.clinician2.name, 'Slow progress'],
      [2, w.org.clinician.name, 'Flare-up'],
      [1, w.org.clinician.name, null],
    ]);
  });

  it('an old version can be opened as it was saved; a version that does not exist → 404', async () => {
    const clin = await w.as('clinician');
    const one = await clin.get(`${w.base}/plans/${planId}/versions/1`);
    expect(one.status).toBe(200);
    expect(one.body).toMatchObject({ planId, version: 1, guidance: 'Keep the back happy' });
    expect(one.body.stages).toEqual([v1[0], { ...v1[1], painCeiling: 5 }]);
    const two = await clin.get(`${w.base}/plans/${planId}/versions/2`);
    expect(two.body.stages[0].painCeiling).toBe(2);
    expect((await clin.get(`${w.base}/plans/${planId}/versions/9`)).status).toBe(404);
  });

  it('a save against an old version → 409 with a message; the stored plan is unchanged', async () => {
    const clin = await w.as('clinician');
    const before = (await clin.get(`${w.base}/plans/${planId}`)).body;
    const stale = await put(clin, `${w.base}/plans/${planId}`, { version: 2, stages: twoStages(), guidance: 'Overwrite attempt' });
    expect(stale.status).toBe(409);
    expect(stale.body.error).toMatchObject({ code: 'version_conflict', message: expect.stringMatching(/Someone else changed this plan/) });
    const after = (await clin.get(`${w.base}/plans/${planId}`)).body;
    expect(after).toEqual(before);
    expect(after).toMatchObject({ version: 3, current: { guidance: 'Longer build' } });
    expect(await versionRows(planId)).toEqual([1, 2, 3]);
    const entries = await h.ds.query(`SELECT count(*) FROM audit_entries WHERE subject_id = $1 AND action = 'plan.revised'`, [planId]);
    expect(Number(entries[0].count)).toBe(2);
  });

  it("'plan.revised' holds the plan before and after, and names the athlete (SECURITY item 27)", async () => {
    const rows: {
      before: { version: number; stages: unknown; guidance: string };
      after: Record<string, unknown>;
      athlete_id: string;
      actor_user_id: string;
    }[] = await h.ds.query(
      `SELECT before, after, athlete_id, actor_user_id FROM audit_entries WHERE subject_id = $1 AND action = 'plan.revised' ORDER BY id`,
      [planId],
    );
    expect(rows).toHaveLength(2);
    expect(rows[0]).toMatchObject({ athlete_id: w.org.athlete.membershipId, actor_user_id: w.org.clinician.userId });
    expect(rows[0].before).toEqual({ version: 1, stages: [v1[0], { ...v1[1], painCeiling: 5 }], guidance: 'Keep the back happy' });
    expect(rows[0].after).toMatchObject({ version: 2, guidance: 'Lower ceiling', changeNote: 'Flare-up' });
    expect((rows[0].after.stages as { painCeiling: number }[])[0].painCeiling).toBe(2);
    expect(rows[1].before).toMatchObject({ version: 2, guidance: 'Lower ceiling' });
    expect(rows[1].after).toMatchObject({ version: 3, guidance: 'Longer build' });
  });
});

describe('who may see a plan (policies/access/restriction-plan.ts; SECURITY item 14)', () => {
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
  // role's reason, which says nothing about whether this plan exists (SECURITY item 14 is met).
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

describe('a change and its audit entry commit or roll back together (SECURITY item 28)', () => {
  it('a transaction that writes a plan version and its audit entry, then fails, leaves neither', async () => {
    const w = await world();
    const { id: planId } = await newPlan(w, await openCase(w));
    const rid = `test-${randomUUID()}`;
    const failure = h.ds.transaction(async (m) => {
      await m.update(RestrictionPlan, { id: planId }, { version: 2 });
      await m.save(
        m.create(RestrictionPlanVersion, {
          planId,
          version: 2,
          stages: twoStages() as never,
          guidance: 'never saved',
          createdBy: w.org.clinician.userId,
        }),
      );
      await appendAudit(m, {
        organizationId: w.org.id,
        actorUserId: w.org.clinician.userId,
        action: 'plan.revised',
        subjectType: 'RestrictionPlan',
        subjectId: planId,
        athleteId: w.org.athlete.membershipId,
        after: { version: 2 },
        requestId: rid,
      });
      // Both writes are really there inside the transaction...
      expect((await m.query('SELECT count(*) FROM audit_entries WHERE request_id = $1', [rid]))[0].count).toBe('1');
      expect((await m.query('SELECT count(*) FROM restriction_plan_versions WHERE plan_id = $1', [planId]))[0].count).toBe('2');
      throw new Error('forced failure after both writes');
    });
    await expect(failure).rejects.toThrow('forced failure after both writes');
    // ...and both are gone after it fails.
    expect(await versionRows(planId)).toEqual([1]);
    expect(await h.ds.query('SELECT id FROM audit_entries WHERE request_id = $1', [rid])).toEqual([]);
    expect((await h.ds.getRepository(RestrictionPlan).findOneByOrFail({ id: planId })).version).toBe(1);
  });

  it('a save whose audit insert fails answers 500 and leaves the plan as it was', async () => {
    const w = await world();
    const clin = await w.as('clinician');
    const { id: planId } = await newPlan(w, await openCase(w));
    // A trigger that refuses audit entries about this one plan only, so other tests running at the
    // same time are untouched.
    const fn = `test_refuse_audit_${planId.replace(/-/g, '')}`;
    await h.ds.query(`CREATE FUNCTION ${fn}() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN IF NEW.subject_id = '${planId}' THEN RAISE EXCEPTION 'audit insert refused for the test'; END IF; RETURN NEW; END $$`);
    await h.ds.query(`CREATE TRIGGER ${fn} BEFORE INSERT ON audit_entries FOR EACH ROW EXECUTE FUNCTION ${fn}()`);
    try {
      const res = await put(clin, `${w.base}/plans/${planId}`, { version: 1, stages: twoStages(), guidance: 'should roll back' });
      expect(res.status).toBe(500);
      expect(JSON.stringify(res.body)).not.toContain('audit insert refused');
    } finally {
      await h.ds.query(`DROP TRIGGER ${fn} ON audit_entries`);
      await h.ds.query(`DROP FUNCTION ${fn}()`);
    }
    expect(await versionRows(planId)).toEqual([1]);
    const plan = (await clin.get(`${w.base}/plans/${planId}`)).body;
    expect(plan).toMatchObject({ version: 1, current: { guidance: 'Keep the back happy' } });
    // With the audit insert allowed again, the very same save goes through: the refusal was the cause.
    const retry = await put(clin, `${w.base}/plans/${planId}`, { version: 1, stages: twoStages(), guidance: 'should roll back' });
    expect(retry.status).toBe(200);
    expect(await versionRows(planId)).toEqual([1, 2]);
  });
});

it('todayIso is the UTC calendar date the server uses for "in force today" (common practice)', () => {
  expect(todayIso(new Date('2026-01-18T23:59:59Z'))).toBe('2026-01-18');
});
