import { randomUUID } from 'node:crypto';
import { expect, test, type APIRequestContext, type Browser, type Page, type TestInfo } from '@playwright/test';
import pg from 'pg';
import type { PlanTemplateDto, SessionDto } from '../policies/dto';
import { DEMO, HOME_HEADING, expectHome, signIn } from './helpers';
import { BROWSER_ZONE, contextOptions, isoDay, stageFieldset } from './plan-helpers';
import { apiWrite } from './uploads-helpers';

/**
 * Plan templates in the browser. Priya (a demo clinician) saves a plan of her own as a
 * template and finds it in the organization's list with its version and author, beside the demo's
 * two; Marcus (the other demo clinician) may copy it but not change it — the page offers no edit and
 * the server refuses one; then Priya starts a new plan from it for another case, the stages dated
 * from the first day she picks, and changes it before saving.
 *
 * Records of its own: an athlete made by SQL with Priya on the care team, its two cases and the plan
 * written through the API, and templates with a unique name. Desktop only: templates are staff screens.
 */

test.skip(({ isMobile }) => isMobile, 'staff screens; one flow over its own records');
test.use({ timezoneId: BROWSER_ZONE });

const DEMO_TEMPLATES = ['Low back, extension-related, young athlete (three stages)', 'Lateral ankle sprain (two stages)'];

/** An athlete of this spec's own on Priya's care team, as an admin's invitation and care-team page would leave them. */
async function athleteOnPriyasTeam(stamp: string): Promise<{ orgId: string; athleteId: string }> {
  const url = process.env.E2E_DATABASE_URL;
  if (!url) throw new Error('E2E_DATABASE_URL is not set: run the browser tests through scripts/test.ts');
  const db = new pg.Client({ connectionString: url });
  await db.connect();
  try {
    const { rows } = await db.query<{ organization_id: string; id: string; password_hash: string }>(
      `SELECT m.organization_id, m.id, u.password_hash FROM memberships m JOIN users u ON u.id = m.user_id WHERE u.email = $1`,
      [DEMO.clinicianPriya.email],
    );
    const { organization_id: orgId, id: priyaId, password_hash: hash } = rows[0];
    const { rows: u } = await db.query<{ id: string }>(
      `INSERT INTO users (email, display_name, password_hash, unit_pref, version) VALUES ($1, $2, $3, 'kg', 1) RETURNING id`,
      [`e2e-templates-${stamp}@harborpoint.example`, `Template Athlete ${stamp}`, hash],
    );
    const { rows: m } = await db.query<{ id: string }>(
      `INSERT INTO memberships (organization_id, user_id, roles, active, version) VALUES ($1, $2, '{athlete}', true, 1) RETURNING id`,
      [orgId, u[0].id],
    );
    await db.query(
      `INSERT INTO athlete_profiles (membership_id, organization_id, date_of_birth, sport, version) VALUES ($1, $2, '2001-04-09', 'Rowing', 1)`,
      [m[0].id, orgId],
    );
    await db.query(`INSERT INTO care_team_assignments (organization_id, athlete_id, member_id, role) VALUES ($1, $2, $3, 'clinician')`, [
      orgId,
      m[0].id,
      priyaId,
    ]);
    return { orgId, athleteId: m[0].id };
  } finally {
    await db.end();
  }
}

/** The status a write gets, with the session's CSRF token as the app's client sends it. */
async function writeStatus(request: APIRequestContext, path: string, data: unknown): Promise<number> {
  const token = ((await (await request.get('/api/session')).json()) as SessionDto).csrfToken;
  return (await request.put(`/api${path}`, { data, headers: { 'X-CSRF-Token': token } })).status();
}

async function clinicianPage(browser: Browser, testInfo: TestInfo, email: string): Promise<Page> {
  const page = await (await browser.newContext(contextOptions(testInfo))).newPage();
  await signIn(page, email);
  await expectHome(page, HOME_HEADING.clinician);
  return page;
}

test('a clinician saves a plan as a template, another copies but cannot edit it, and a new plan starts from it dated from its first day', async ({
  browser,
}, testInfo) => {
  test.setTimeout(120_000);
  const stamp = `${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}`;
  const name = `Knee, patellar tendon (e2e ${stamp})`;
  const { orgId, athleteId } = await athleteOnPriyasTeam(stamp);
  const priya = await clinicianPage(browser, testInfo, DEMO.clinicianPriya.email);

  // Two cases; the first gets a two-stage plan: days 0–9, then days 10–27 from its first day.
  const newCase = () =>
    apiWrite<{ id: string }>(priya.request, 'post', `/orgs/${orgId}/cases`, {
      athleteId,
      bodyRegions: ['knee_left'],
      onsetDate: isoDay(-3),
      status: 'limited',
      statusEffectiveFrom: isoDay(-3),
    });
  const first = await newCase();
  await apiWrite(priya.request, 'post', `/orgs/${orgId}/cases/${first.id}/plan`, {
    stages: [
      {
        id: randomUUID(),
        label: 'Calm',
        startDate: isoDay(-2),
        endDate: isoDay(7),
        painCeiling: 3,
        patterns: { jump: { mode: 'blocked' } },
      },
      { id: randomUUID(), label: 'Load', startDate: isoDay(8), endDate: isoDay(25), painCeiling: 4, patterns: {} },
    ],
    guidance: 'Cycling is fine; no jumping yet.',
  });

  // Saved as a template from the case: its name is the clinician's own.
  await priya.goto(`/clinician/cases/${first.id}`);
  await priya.getByRole('button', { name: 'Save as template' }).click();
  const save = priya.getByRole('form', { name: 'Save this plan as a template' });
  await save.getByLabel('Template name').fill(name);
  await save.getByRole('button', { name: 'Save template' }).click();
  await expect(priya.getByRole('status').filter({ hasText: `Saved as the template “${name}”` })).toBeVisible();

  // The organization's list: hers with its version and author, and the demo's own two.
  await priya.getByRole('link', { name: 'Plan templates' }).first().click();
  await expectHome(priya, 'Plan templates');
  const list = priya.getByRole('list', { name: 'Templates' });
  const mine = list.getByRole('listitem').filter({ hasText: name });
  await expect(mine).toContainText(`By ${DEMO.clinicianPriya.name} · version 1 · 2 stages, 28 days`);
  for (const demo of DEMO_TEMPLATES) await expect(list.getByRole('link', { name: demo, exact: true })).toBeVisible();

  // Marcus may copy it, not change it: no edit on the page, and the server refuses one (403).
  const marcus = await clinicianPage(browser, testInfo, DEMO.clinicianMarcus.email);
  await marcus.goto('/clinician/plan-templates');
  await marcus.getByRole('link', { name, exact: true }).click();
  await expectHome(marcus, `Plan template: ${name}`);
  const templateId = new URL(marcus.url()).pathname.split('/').at(-1)!;
  await expect(marcus.getByText('Only its author or an admin changes this template.')).toBeVisible();
  await expect(marcus.getByRole('button', { name: 'Edit template' })).toHaveCount(0);
  const asSaved = (await (await marcus.request.get(`/api/orgs/${orgId}/plan-templates/${templateId}`)).json()) as PlanTemplateDto;
  const { name: _n, description, stages, guidance, version } = asSaved;
  const put = { name: 'Taken over', description, stages, guidance, version };
  expect(await writeStatus(marcus.request, `/orgs/${orgId}/plan-templates/${templateId}`, put)).toBe(403);
  await marcus.getByRole('button', { name: 'Copy as my own' }).click();
  await expectHome(marcus, `Plan template: ${name} (copy)`);
  await expect(marcus.getByText(`By ${DEMO.clinicianMarcus.name} · version 1`)).toBeVisible();
  await expect(marcus.getByRole('button', { name: 'Edit template' })).toBeVisible();
  await marcus.context().close();

  // A new plan from the template for the second case, from a first day five days ahead.
  const second = await newCase();
  await priya.goto(`/clinician/cases/${second.id}`);
  await priya.getByRole('button', { name: 'Write the restriction plan' }).click();
  const editor = priya.getByRole('form', { name: 'Write the restriction plan' });
  await editor.getByRole('button', { name: 'Start from a template' }).click();
  await editor.getByLabel('Template', { exact: true }).selectOption({ label: `${name} (2 stages, 28 days)` });
  await editor.getByLabel('First day of the plan').fill(isoDay(5));
  await editor.getByRole('button', { name: 'Use this template' }).click();
  await expect(editor.getByRole('status').filter({ hasText: `Started from “${name}”` })).toBeVisible();
  // Stage 2 runs days 10–27 from the first day: isoDay(5 + 10) to isoDay(5 + 27).
  const stage1 = stageFieldset(priya, 1);
  const stage2 = stageFieldset(priya, 2);
  await expect(stage1.getByLabel('Start date', { exact: true })).toHaveValue(isoDay(5));
  await expect(stage1.getByLabel('End date', { exact: true })).toHaveValue(isoDay(14));
  await expect(stage2.getByLabel('Start date', { exact: true })).toHaveValue(isoDay(15));
  await expect(stage2.getByLabel('End date', { exact: true })).toHaveValue(isoDay(32));
  await expect(editor.getByLabel('Guidance for the athlete and family')).toHaveValue('Cycling is fine; no jumping yet.');

  // Everything stays editable before saving: a longer second stage and a lower first ceiling.
  await stage2.getByLabel('End date', { exact: true }).fill(isoDay(39));
  await stage1.getByLabel('Pain ceiling', { exact: true }).fill('2');
  await editor.getByRole('button', { name: 'Save plan' }).click();
  await expect(priya.getByRole('button', { name: 'Edit plan' })).toBeVisible();
  await priya.getByRole('button', { name: 'Edit plan' }).click();
  const saved = priya.getByRole('form', { name: 'Edit the restriction plan' });
  await expect(saved).toBeVisible();
  await expect(stage2.getByLabel('Start date', { exact: true })).toHaveValue(isoDay(15));
  await expect(stage2.getByLabel('End date', { exact: true })).toHaveValue(isoDay(39));
  await expect(stage1.getByLabel('Pain ceiling', { exact: true })).toHaveValue('2');
  await saved.getByRole('button', { name: 'Cancel' }).click();
  await priya.context().close();
});
