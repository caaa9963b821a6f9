import { describe, expect, it } from 'vitest';
import type { PlanTemplateDto, PlanTemplateSummaryDto } from '../../../../policies/dto';
import { planStagesFromTemplate } from '../../../../policies/load/plan-template';
import { signedIn, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD } from '../../test/factories';
import { planWorld, put, twoStages } from '../../test/worlds/plan-world';

/** Plan templates: saved from a plan, shared, owned by their author, copied, and started from. */
const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { world, openCase, newPlan } = planWorld(h);

const simple = (over: object = {}) => ({
  name: 'Ankle sprain, three stages',
  description: 'Lateral ankle sprain, no fracture.',
  stages: [
    { label: 'Protect', startOffset: 0, endOffset: 6, painCeiling: 2, patterns: { jump: { mode: 'blocked' } } },
    { label: 'Load', startOffset: 7, endOffset: 20, patterns: { jump: { mode: 'capped', caps: { maxSetsPerSession: 3 } } } },
  ],
  guidance: 'Walk as comfort allows.',
  ...over,
});

const auditActions = async (id: string) =>
  (
    (await h.ds.query(`SELECT action, athlete_id FROM audit_entries WHERE subject_type = 'PlanTemplate' AND subject_id = $1 ORDER BY id`, [
      id,
    ])) as { action: string; athlete_id: string | null }[]
  ).map((r) => [r.action, r.athlete_id]);

describe('plan templates', () => {
  it('a clinician saves a plan as a template: stages become days from the start, copied whole, audited without an athlete', async () => {
    const w = await world();
    const clin = await w.as('clinician');
    const caseId = await openCase(w);
    const plan = await newPlan(w, caseId);
    const res = await clin.post(`${w.base}/plan-templates/from-plan`, { planId: plan.id, name: 'Back, two stages' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const t = res.body as PlanTemplateDto;
    // 5 Jan → 18 Jan is days 0–13; 25 Jan → 7 Feb is days 20–33 (the six-day gap kept).
    expect(t.stages.map((s) => [s.label, s.startOffset, s.endOffset])).toEqual([
      ['Protect', 0, 13],
      ['Build', 20, 33],
    ]);
    expect(t.stages[0]).toMatchObject({ painCeiling: 3, patterns: plan.stages[0].patterns });
    expect(t.stages[0]).not.toHaveProperty('startDate');
    expect(t).toMatchObject({
      name: 'Back, two stages',
      guidance: 'Keep the back happy',
      authorId: w.org.clinician.membershipId,
      authorName: w.org.clinician.name,
      stageCount: 2,
      lengthDays: 34,
      canEdit: true,
      version: 1,
    });
    expect(await auditActions(t.id)).toEqual([['plan_template.created', null]]);

    // Started again on another day, the stages keep their lengths and gap (dated on the client).
    const started = planStagesFromTemplate(t.stages, '2026-06-01', () => crypto.randomUUID());
    expect(started.map((s) => [s.startDate, s.endDate])).toEqual([
      ['2026-06-01', '2026-06-14'],
      ['2026-06-21', '2026-07-04'],
    ]);
  });

  it("only the plan's own clinicians may save it as a template (another clinician: 404)", async () => {
    const w = await world();
    const plan = await newPlan(w, await openCase(w));
    const res = await (await w.as('otherClinician')).post(`${w.base}/plan-templates/from-plan`, { planId: plan.id, name: 'Not mine' });
    expect(res.status).toBe(404);
  });

  it('every clinician and admin lists the templates; coaches, athletes and guardians are refused', async () => {
    const w = await world();
    const created = (await (await w.as('clinician')).post(`${w.base}/plan-templates`, simple({ name: 'Zz listed' })))
      .body as PlanTemplateDto;
    for (const who of ['clinician', 'otherClinician', 'admin'] as const) {
      const list = (await (await w.as(who)).get(`${w.base}/plan-templates`)).body as PlanTemplateSummaryDto[];
      const row = list.find((t) => t.id === created.id);
      expect(row, who).toMatchObject({ name: 'Zz listed', stageCount: 2, lengthDays: 21, canEdit: who !== 'otherClinician' });
      expect(row).not.toHaveProperty('stages');
    }
    for (const who of ['coach', 'athlete', 'guardian'] as const) {
      expect((await (await w.as(who)).get(`${w.base}/plan-templates`)).status, who).toBe(403);
      expect((await (await w.as(who)).get(`${w.base}/plan-templates/${created.id}`)).status, who).toBe(403);
    }
  });

  it('another organization sees nothing of them (404)', async () => {
    const w = await world();
    const created = (await (await w.as('clinician')).post(`${w.base}/plan-templates`, simple())).body as PlanTemplateDto;
    const orgB = await createOrg(h.ds);
    const clinB = await signedIn(h.app, orgB.clinician.email, TEST_PASSWORD);
    expect((await clinB.get(`/api/orgs/${orgB.id}/plan-templates/${created.id}`)).status).toBe(404);
    expect((await clinB.post(`/api/orgs/${orgB.id}/plan-templates/${created.id}/copy`, {})).status).toBe(404);
    expect(((await clinB.get(`/api/orgs/${orgB.id}/plan-templates`)).body as PlanTemplateSummaryDto[]).map((t) => t.id)).not.toContain(
      created.id,
    );
  });

  it('the author edits against the version they saw (409 on a stale one); another clinician is refused (403) and copies instead', async () => {
    const w = await world();
    const author = await w.as('clinician');
    const t = (await author.post(`${w.base}/plan-templates`, simple())).body as PlanTemplateDto;
    const edited = await put(author, `${w.base}/plan-templates/${t.id}`, simple({ name: 'Ankle, edited', version: 1 }));
    expect(edited.status, JSON.stringify(edited.body)).toBe(200);
    expect(edited.body).toMatchObject({ name: 'Ankle, edited', version: 2 });
    const stale = await put(author, `${w.base}/plan-templates/${t.id}`, simple({ version: 1 }));
    expect(stale.status).toBe(409);

    const other = await w.as('otherClinician');
    expect((await put(other, `${w.base}/plan-templates/${t.id}`, simple({ version: 2 }))).status).toBe(403);
    const copy = await other.post(`${w.base}/plan-templates/${t.id}/copy`, {});
    expect(copy.status, JSON.stringify(copy.body)).toBe(201);
    expect(copy.body).toMatchObject({
      name: 'Ankle, edited (copy)',
      authorId: w.org.otherClinician.membershipId,
      canEdit: true,
      version: 1,
    });
    expect((copy.body as PlanTemplateDto).stages).toEqual((edited.body as PlanTemplateDto).stages);
    const mine = await put(other, `${w.base}/plan-templates/${copy.body.id}`, simple({ name: 'My ankle', version: 1 }));
    expect(mine.status).toBe(200);

    // An admin keeps the library: edits and archives anyone's; an archived one leaves the list and changes no more.
    const admin = await w.as('admin');
    const archived = await admin.post(`${w.base}/plan-templates/${t.id}/archive`, { version: 2 });
    expect(archived.status, JSON.stringify(archived.body)).toBe(200);
    expect(archived.body).toMatchObject({ canEdit: false, version: 3 });
    expect(((await author.get(`${w.base}/plan-templates`)).body as PlanTemplateSummaryDto[]).map((x) => x.id)).not.toContain(t.id);
    expect((await put(author, `${w.base}/plan-templates/${t.id}`, simple({ version: 3 }))).status).toBe(409);
    expect(await auditActions(t.id)).toEqual([
      ['plan_template.created', null],
      ['plan_template.updated', null],
      ['plan_template.archived', null],
    ]);
    expect(await auditActions(copy.body.id)).toEqual([
      ['plan_template.copied', null],
      ['plan_template.updated', null],
    ]);
  });

  it("a plan started from a template names the template (id, version, name) in its creation's audit entry", async () => {
    const w = await world();
    const clin = await w.as('clinician');
    const t = (await clin.post(`${w.base}/plan-templates`, simple())).body as PlanTemplateDto;
    const stages = planStagesFromTemplate(t.stages, '2026-01-05', () => crypto.randomUUID());
    const caseId = await openCase(w);
    const res = await clin.post(`${w.base}/cases/${caseId}/plan`, { stages, guidance: t.guidance, fromTemplate: { id: t.id, version: 1 } });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const [entry] = (await h.ds.query(`SELECT after FROM audit_entries WHERE action = 'plan.created' AND subject_id = $1`, [
      res.body.id,
    ])) as { after: { fromTemplate?: unknown } }[];
    expect(entry.after.fromTemplate).toEqual({ id: t.id, version: 1, name: 'Ankle sprain, three stages' });

    // A template that is not the organization's is a 404, and no plan is written.
    const secondCase = await openCase(w);
    const unknown = await clin.post(`${w.base}/cases/${secondCase}/plan`, {
      stages,
      fromTemplate: { id: crypto.randomUUID(), version: 1 },
    });
    expect(unknown.status).toBe(404);
    expect(await h.ds.query(`SELECT 1 FROM restriction_plans WHERE case_id = $1`, [secondCase])).toEqual([]);
    // An edit has no template to name: the field is refused there.
    const edit = await put(clin, `${w.base}/plans/${res.body.id}`, { stages, version: 1, fromTemplate: { id: t.id, version: 1 } });
    expect(edit.status).toBe(400);
  });

  it('an admin may not write templates (403): they write no plans', async () => {
    const w = await world();
    expect((await (await w.as('admin')).post(`${w.base}/plan-templates`, simple())).status).toBe(403);
  });

  it('bad input is a 400 naming the field: overlapping days, an end before its start, a stage with a date', async () => {
    const w = await world();
    const clin = await w.as('clinician');
    const overlap = simple({
      stages: [
        { startOffset: 0, endOffset: 6, patterns: {} },
        { startOffset: 6, endOffset: 9, patterns: {} },
      ],
    });
    const res = await clin.post(`${w.base}/plan-templates`, overlap);
    expect(res.status).toBe(400);
    expect(res.body.error.fields['stages.1.startOffset']).toEqual([expect.stringMatching(/overlaps stage 1 \(which ends on day 7\)/)]);
    const backwards = await clin.post(`${w.base}/plan-templates`, simple({ stages: [{ startOffset: 5, endOffset: 2, patterns: {} }] }));
    expect(backwards.body.error.fields['stages.0.endOffset']).toBeDefined();
    const dated = await clin.post(`${w.base}/plan-templates`, simple({ stages: [{ ...twoStages()[0], startOffset: 0, endOffset: 3 }] }));
    expect(dated.status).toBe(400);
    expect(Object.keys(dated.body.error.fields).join(' ')).toMatch(/stages\.0/);
    expect((await clin.post(`${w.base}/plan-templates`, simple({ name: '' }))).body.error.fields.name).toBeDefined();
  });
});
