import { randomUUID } from 'node:crypto';
import { expect, test, type Browser, type Page, type TestInfo } from '@playwright/test';
import pg from 'pg';
import { DEMO, HOME_HEADING, expectHome, expectNoSidewaysScroll, keepScreenshot, signIn } from './helpers';
import { BROWSER_ZONE, contextOptions, isoDay, newPhonePage } from './plan-helpers';
import { apiWrite } from './uploads-helpers';
import { pickScore } from './athlete-helpers';

/**
 * Exit criteria of a plan's stage (criteria-based progression), in the browser.
 *
 * First, on the demo as loaded (read only, so any other spec can rely on it): Maya's "Settle" stage has
 * its criteria part met — Priya's bending check done, Maya's readiness not yet — and each person reads
 * it in their own words: Priya the state and evidence of each, Maya and her mother Elena what unlocks
 * the next stage in plain words, Theo (her coach) the same panel with nothing to press.
 *
 * Then a whole round on records this spec owns (a clinician, a coach, a 15-year-old and her guardian
 * made by SQL, a case and plan written through the API): the clinician records a check, the athlete
 * says how ready she feels, the guardian and the coach read it, the clinician edits a criterion in the
 * plan editor, and once all are met moves to the next stage as a shared decision — recorded with who
 * agreed and audited. Criteria agreed with the athlete: Bern consensus (Ardern et al. 2016, BJSM 50:853–864).
 */

test.use({ timezoneId: BROWSER_ZONE });

async function sql<T extends pg.QueryResultRow>(text: string, values: unknown[]): Promise<T[]> {
  const url = process.env.E2E_DATABASE_URL;
  if (!url) throw new Error('E2E_DATABASE_URL is not set: run the browser tests through scripts/test.ts');
  const db = new pg.Client({ connectionString: url });
  await db.connect();
  try {
    return (await db.query<T>(text, values)).rows;
  } finally {
    await db.end();
  }
}

async function newPage(browser: Browser, testInfo: TestInfo): Promise<Page> {
  return (await browser.newContext(contextOptions(testInfo))).newPage();
}

test("on the demo, Maya's stage criteria are part met and each person reads them in their own words", async ({ browser }, testInfo) => {
  test.setTimeout(90_000);
  const priya = await newPage(browser, testInfo);
  await signIn(priya, DEMO.clinicianPriya.email);
  await expectHome(priya, HOME_HEADING.clinician);
  // The case that carries Maya's plan (the demo's pain report opened it).
  const [{ case_id: caseId }] = await sql<{ case_id: string }>(
    `SELECT p.case_id FROM restriction_plans p JOIN memberships m ON m.id = p.athlete_id JOIN users u ON u.id = m.user_id WHERE u.email = $1`,
    [DEMO.maya.email],
  );
  await priya.goto(`/clinician/cases/${caseId}`);
  const panel = priya.getByRole('region', { name: 'Stage criteria' });
  await expect(panel).toContainText(/Criteria to leave stage 1 \(Settle\) — [0-3] of 4 met/, { timeout: 20_000 });
  // The clinician's own check, with its evidence (the date and the note of the assessment).
  const bend = panel.getByRole('listitem').filter({ hasText: 'Bends forward to touch the shins without pain' });
  await expect(bend).toContainText('✓ Met');
  await expect(bend).toContainText(/assessed \d{4}-\d\d-\d\d: yes — Touches the shins/);
  // Maya's readiness: 5 of the 7 asked, so not yet.
  const ready = panel.getByRole('listitem').filter({ hasText: 'Feeling ready to move on' });
  await expect(ready).toContainText('… Not yet');
  await expect(ready).toContainText(/readiness 5\/10 on \d{4}-\d\d-\d\d \(needs ≥ 7\)/);
  await expect(panel.getByRole('listitem').filter({ hasText: 'No warning signs' })).toContainText(
    'no warning-sign answer since the stage began',
  );
  await expect(panel.getByRole('button', { name: 'Record an assessment' })).toBeVisible();
  await priya.context().close();

  // Maya and her mother read it in plain words, with no evidence lines and no notes.
  for (const who of [DEMO.maya, DEMO.elena]) {
    const page = await newPhonePage(browser, testInfo);
    await signIn(page, who.email);
    const unlocks = page.getByRole('region', { name: 'What unlocks the next stage' });
    await expect(unlocks).toContainText(/[0-3] of 4 done/, { timeout: 20_000 });
    await expect(unlocks).toContainText('Feeling ready to move on: at least 7 out of 10 when asked.');
    await expect(unlocks).toContainText('A check with the clinician: Bends forward to touch the shins without pain.');
    await expect(unlocks).not.toContainText('Touches the shins');
    await expect(unlocks.getByRole('radiogroup')).toHaveCount(who === DEMO.maya ? 1 : 0);
    await expectNoSidewaysScroll(page);
    await page.context().close();
  }

  // Theo sees the stage and what unlocks it, read only.
  const theo = await newPage(browser, testInfo);
  await signIn(theo, DEMO.coachTheo.email);
  await theo.getByRole('link', { name: DEMO.maya.name, exact: true }).first().click();
  const coachPanel = theo.getByRole('region', { name: 'Stage criteria' });
  await expect(coachPanel).toContainText(/Criteria to leave stage 1 \(Settle\) — [0-3] of 4 met/, { timeout: 20_000 });
  await expect(coachPanel.getByRole('button')).toHaveCount(0);
  await theo.context().close();
});

interface Cast {
  orgId: string;
  clinician: { email: string; name: string };
  coach: { email: string; name: string };
  athlete: { email: string; name: string; id: string };
  guardian: { email: string; name: string };
}

/** The people, by SQL, as an admin's invitations would leave them (as e2e/team-programs.spec.ts does). */
async function castRound(): Promise<Cast> {
  const url = process.env.E2E_DATABASE_URL;
  if (!url) throw new Error('E2E_DATABASE_URL is not set: run the browser tests through scripts/test.ts');
  const db = new pg.Client({ connectionString: url });
  await db.connect();
  try {
    const stamp = `${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}`;
    const { rows } = await db.query<{ organization_id: string; password_hash: string }>(
      `SELECT m.organization_id, u.password_hash FROM memberships m JOIN users u ON u.id = m.user_id WHERE u.email = $1`,
      [DEMO.admin.email],
    );
    const { organization_id: orgId, password_hash: hash } = rows[0];
    const person = async (label: string, name: string, roles: string[]) => {
      const email = `e2e-criteria-${label}-${stamp}@harborpoint.example`;
      const { rows: u } = await db.query<{ id: string }>(
        `INSERT INTO users (email, display_name, password_hash, unit_pref, version) VALUES ($1, $2, $3, 'kg', 1) RETURNING id`,
        [email, name, hash],
      );
      const { rows: m } = await db.query<{ id: string }>(
        `INSERT INTO memberships (organization_id, user_id, roles, active, version) VALUES ($1, $2, $3::text[], true, 1) RETURNING id`,
        [orgId, u[0].id, roles],
      );
      if (roles.includes('athlete'))
        await db.query(
          `INSERT INTO athlete_profiles (membership_id, organization_id, date_of_birth, sport, version) VALUES ($1, $2, $3, 'Volleyball', 1)`,
          [m[0].id, orgId, isoDay(-15 * 365 - 100)],
        );
      return { email, name, id: m[0].id };
    };
    const clinician = await person('clinician', `Criteria Clinician ${stamp}`, ['clinician']);
    const coach = await person('coach', `Criteria Coach ${stamp}`, ['coach']);
    const athlete = await person('athlete', `Criteria Athlete ${stamp}`, ['athlete']);
    const guardian = await person('guardian', `Criteria Parent ${stamp}`, ['guardian']);
    for (const [member, role] of [
      [clinician.id, 'clinician'],
      [coach.id, 'coach'],
    ])
      await db.query(`INSERT INTO care_team_assignments (organization_id, athlete_id, member_id, role) VALUES ($1, $2, $3, $4)`, [
        orgId,
        athlete.id,
        member,
        role,
      ]);
    await db.query(`INSERT INTO guardian_links (organization_id, athlete_id, guardian_id) VALUES ($1, $2, $3)`, [
      orgId,
      athlete.id,
      guardian.id,
    ]);
    return { orgId, clinician, coach, athlete, guardian };
  } finally {
    await db.end();
  }
}

const STAGE_START = isoDay(-6);
const NEXT_START = isoDay(8);

test('a round of criteria: a check, the athlete’s readiness, an edited criterion, and a shared decision to move on', async ({
  browser,
}, testInfo) => {
  test.skip(testInfo.project.name !== 'desktop', 'one flow over its own records; the athlete’s and family’s phones are opened inside it');
  test.setTimeout(240_000);
  const cast = await castRound();
  const clinician = await newPage(browser, testInfo);
  await signIn(clinician, cast.clinician.email);

  // The case and a two-stage plan, through the API as the clinician: three criteria to leave stage 1.
  const c = await apiWrite<{ id: string }>(clinician.request, 'post', `/orgs/${cast.orgId}/cases`, {
    athleteId: cast.athlete.id,
    bodyRegions: ['ankle_foot_left'],
    onsetDate: STAGE_START,
    status: 'limited',
    statusEffectiveFrom: STAGE_START,
  });
  const checkId = randomUUID();
  await apiWrite(clinician.request, 'post', `/orgs/${cast.orgId}/cases/${c.id}/plan`, {
    stages: [
      {
        id: randomUUID(),
        label: 'Protect',
        startDate: STAGE_START,
        endDate: isoDay(7),
        painCeiling: 3,
        patterns: { jump: { mode: 'blocked' } },
        criteria: [
          { id: randomUUID(), kind: 'record', rule: 'no_red_flags' },
          { id: checkId, kind: 'clinician', label: 'Ten single-leg hops without pain', measure: 'yes_no' },
          { id: randomUUID(), kind: 'athlete', threshold: 8 },
        ],
      },
      { id: randomUUID(), label: 'Load', startDate: NEXT_START, endDate: isoDay(30), painCeiling: 4, patterns: {} },
    ],
    guidance: 'Walk and cycle freely; no jumping until the next stage.',
  });

  // The clinician sees each criterion's state and evidence, and records the hop check.
  await clinician.goto(`/clinician/cases/${c.id}`);
  const panel = clinician.getByRole('region', { name: 'Stage criteria' });
  await expect(panel).toContainText('Criteria to leave stage 1 (Protect) — 1 of 3 met', { timeout: 20_000 });
  const hop = panel.getByRole('listitem').filter({ hasText: 'Ten single-leg hops without pain' });
  await expect(hop).toContainText('○ Nothing yet');
  await expect(hop).toContainText('not assessed in this stage yet');
  await hop.getByRole('button', { name: 'Record an assessment' }).click();
  await hop.getByRole('radio', { name: 'Yes' }).check();
  await hop.getByLabel('Note (care team only)').fill('Ten each side, no pain, good landing.');
  await hop.getByRole('button', { name: 'Save assessment' }).click();
  await expect(panel).toContainText('Criteria to leave stage 1 (Protect) — 2 of 3 met');
  await expect(hop).toContainText(/assessed \d{4}-\d\d-\d\d: yes — Ten each side/);

  // The athlete, on her phone, reads what unlocks the next stage and says how ready she feels: 7.
  const athlete = await newPhonePage(browser, testInfo);
  await signIn(athlete, cast.athlete.email);
  const unlocks = athlete.getByRole('region', { name: 'What unlocks the next stage' });
  await expect(unlocks).toContainText('2 of 3 done', { timeout: 20_000 });
  await expect(unlocks).toContainText('A check with the clinician: Ten single-leg hops without pain. Done.');
  await expect(unlocks).toContainText('Feeling ready to move on: at least 8 out of 10 when asked. Not answered yet in this stage.');
  await expect(unlocks).not.toContainText('good landing');
  await pickScore(athlete, 'How ready do you feel to move on?', 7);
  await unlocks.getByRole('button', { name: 'Send' }).click();
  await expect(unlocks.getByText('Thanks — your clinician will see it.')).toBeVisible();
  await expect(unlocks).toContainText('at least 8 out of 10 when asked. Not yet.');
  await expectNoSidewaysScroll(athlete);
  await keepScreenshot(athlete, testInfo, 'stage-criteria-athlete');

  // Her guardian reads the same, in the family's words, with nothing to answer.
  const guardian = await newPhonePage(browser, testInfo);
  await signIn(guardian, cast.guardian.email);
  const family = guardian.getByRole('region', { name: 'What unlocks the next stage' });
  await expect(family).toContainText('2 of 3 done', { timeout: 20_000 });
  // The family's words name the athlete by first name.
  await expect(family).toContainText('the clinician talks it through with Criteria and you');
  await expect(family.getByRole('radiogroup')).toHaveCount(0);
  await guardian.context().close();

  // The coach sees the stage and what unlocks it, with nothing to press.
  const coach = await newPage(browser, testInfo);
  await signIn(coach, cast.coach.email);
  await coach.goto(`/coach/athletes/${cast.athlete.id}`);
  const coachPanel = coach.getByRole('region', { name: 'Stage criteria' });
  await expect(coachPanel).toContainText('Criteria to leave stage 1 (Protect) — 2 of 3 met', { timeout: 20_000 });
  await expect(coachPanel).toContainText('readiness 7/10');
  await expect(coachPanel.getByRole('button')).toHaveCount(0);
  await coach.context().close();

  // After talking it through, the clinician sets the readiness asked to 7 in the plan editor.
  await clinician.reload();
  await expect(panel).toContainText('2 of 3 met');
  await clinician.getByRole('button', { name: 'Edit plan' }).click();
  const editor = clinician.getByRole('form', { name: 'Edit the restriction plan' });
  const stage1 = editor.getByRole('group', { name: 'Stage 1', exact: true });
  const readiness = stage1.getByRole('group', { name: 'Criterion 3: Reported by the athlete' });
  await expect(readiness.getByLabel('Readiness needed')).toHaveValue('8');
  await readiness.getByLabel('Readiness needed').fill('11');
  await editor.getByRole('button', { name: 'Save plan' }).click();
  await expect(editor.getByRole('alert')).toContainText('Stage 1, criterion 3: Readiness needed must be 0–10');
  await readiness.getByLabel('Readiness needed').fill('7');
  await expect(readiness).toContainText('The athlete reads: Feeling ready to move on: at least 7 out of 10 when asked.');
  await editor.getByLabel('Change note (optional)').fill('Agreed 7 of 10 is ready enough with her.');
  await editor.getByRole('button', { name: 'Save plan' }).click();
  await expect(clinician.getByRole('status').filter({ hasText: 'Version 2 saved.' })).toBeVisible();

  // All met: the clinician is asked, never moved automatically, and records who agreed.
  await expect(panel).toContainText('Criteria to leave stage 1 (Protect) — 3 of 3 met');
  await expect(panel).toContainText('Every criterion is met. Move on to stage 2 (Load)?');
  await panel.getByRole('button', { name: 'Move to stage 2 (Load)…' }).click();
  const move = clinician.getByRole('form', { name: 'Move to the next stage' });
  await move.getByRole('button', { name: 'Record the decision and move on' }).click();
  await expect(move).toContainText('Who agreed must name who agreed');
  await move.getByRole('checkbox', { name: 'The athlete' }).check();
  await move.getByRole('checkbox', { name: 'A parent or guardian' }).check();
  await move.getByLabel('Note').fill('Talked it through with both.');
  await move.getByRole('button', { name: 'Record the decision and move on' }).click();
  await expect(panel).toContainText(/agreed with athlete, guardian — recorded by Criteria Clinician/);
  await expect(panel).toContainText('8 days early; 3 of 3 criteria met');
  await keepScreenshot(clinician, testInfo, 'stage-criteria-decision');

  // Audited: the decision is in the trail, said as a sentence.
  await clinician.goto('/clinician/audit');
  await expect(
    clinician.getByText(/moved Criteria Athlete \S+ to the next stage of the plan \(8 days earlier than planned\)/),
  ).toBeVisible();
  await athlete.context().close();
  await clinician.context().close();
});
