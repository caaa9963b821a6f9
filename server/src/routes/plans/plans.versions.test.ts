import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import { RestrictionPlan, RestrictionPlanVersion } from '../../entities';
import { appendAudit } from '../../services/audit';
import { useHarness } from '../../test/harness';
import { planWorld, put, twoStages, type World } from '../../test/worlds/plan-world';
import { asOwner } from '../../test/owner';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { world, openCase, newPlan, versionRows } = planWorld(h);

describe('versions and optimistic locking (RFC 9110 §15.5.10 409 Conflict)', () => {
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

  it('the versions list is newest first, with who saved each (45 CFR 164.312(b); ASVS 5.0 V16.2: who changed what)', async () => {
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

  it("'plan.revised' holds the plan before and after, and names the athlete (45 CFR 164.312(b); ASVS 5.0 V16.2)", async () => {
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

describe('a change and its audit entry commit or roll back together (OWASP Top 10 A09:2025)', () => {
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
    // As the owner: the app's own role may create no function and no trigger on audit_entries.
    await asOwner((c) =>
      c.query(`CREATE FUNCTION ${fn}() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN IF NEW.subject_id = '${planId}' THEN RAISE EXCEPTION 'audit insert refused for the test'; END IF; RETURN NEW; END $$`),
    );
    await asOwner((c) => c.query(`CREATE TRIGGER ${fn} BEFORE INSERT ON audit_entries FOR EACH ROW EXECUTE FUNCTION ${fn}()`));
    try {
      const res = await put(clin, `${w.base}/plans/${planId}`, { version: 1, stages: twoStages(), guidance: 'should roll back' });
      expect(res.status).toBe(500);
      expect(JSON.stringify(res.body)).not.toContain('audit insert refused');
    } finally {
      await asOwner(async (c) => {
        await c.query(`DROP TRIGGER ${fn} ON audit_entries`);
        await c.query(`DROP FUNCTION ${fn}()`);
      });
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
