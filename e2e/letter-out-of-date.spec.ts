import { expect, test } from '@playwright/test';
import pg from 'pg';
import { DEMO, HOME_HEADING, acceptInvitation, createInvitation, expectHome, keepScreenshot, signIn, uniqueEmail } from './helpers';
import { lettersSection, signDraftLetter, writeDraftLetter } from './letters-helpers';
import { BROWSER_ZONE, contextOptions, fillStageDates, isoDay, setPattern, stageFieldset } from './plan-helpers';

/** The letter's plain words for the two hinge caps (policies/plain-words.ts). */
const HINGE_60 =
  'Lifting things from the floor or bending forward at the hips: weights no heavier than three fifths of the most that can be lifted once.';
const HINGE_50 =
  'Lifting things from the floor or bending forward at the hips: weights no heavier than half of the most that can be lifted once.';

/**
 * Letters never go stale: Priya signs a Limited letter for an athlete of this
 * spec's own (invited fresh, so no other spec's letters or plans are touched), then tightens the plan.
 * The letter in force reads "Out of date"; one click opens the updated letter filled in from the plan
 * now in force; signing it replaces the old letter and the mark is gone. Desktop only: the plan editor
 * and the letter editor are staff screens.
 */

test.skip(({ isMobile }) => isMobile, 'staff screens; one flow over shared records');
test.use({ timezoneId: BROWSER_ZONE });

const NAME = 'Noor Okafor';

/** Puts Priya on the new athlete's care team, as an admin would on the care-team page. */
async function onPriyasTeam(athleteEmail: string): Promise<string> {
  const url = process.env.E2E_DATABASE_URL;
  if (!url) throw new Error('E2E_DATABASE_URL is not set: run the browser tests through scripts/test.ts');
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    const { rows } = await client.query<{ athlete_id: string; clinician_id: string; organization_id: string }>(
      `SELECT a.id AS athlete_id, c.id AS clinician_id, a.organization_id
         FROM memberships a JOIN users au ON au.id = a.user_id
         JOIN memberships c ON c.organization_id = a.organization_id JOIN users cu ON cu.id = c.user_id
        WHERE au.email = $1 AND cu.email = $2`,
      [athleteEmail, DEMO.clinicianPriya.email],
    );
    expect(rows).toHaveLength(1);
    const r = rows[0];
    await client.query(
      `INSERT INTO care_team_assignments (organization_id, athlete_id, member_id, role) VALUES ($1, $2, $3, 'clinician')`,
      [r.organization_id, r.athlete_id, r.clinician_id],
    );
    return r.athlete_id;
  } finally {
    await client.end();
  }
}

test('a plan change marks the letter out of date; one click writes the updated letter, filled in; signing it clears the mark', async ({
  page,
  browser,
}, testInfo) => {
  test.setTimeout(120_000);
  await signIn(page, DEMO.admin.email);
  const email = uniqueEmail(testInfo, 'letterstale');
  const link = await createInvitation(page, { email, name: NAME, roles: ['Athlete'] });
  await (await acceptInvitation(browser, testInfo, link, NAME)).context().close();
  const athleteId = await onPriyasTeam(email);

  const priyaContext = await browser.newContext(contextOptions(testInfo));
  const priya = await priyaContext.newPage();
  try {
    await signIn(priya, DEMO.clinicianPriya.email);
    await expectHome(priya, HOME_HEADING.clinician);
    await priya.goto(`/clinician/athletes/${athleteId}`);
    await expectHome(priya, NAME);

    // A Limited case with a one-stage plan: hinge up to 60%.
    await priya.getByRole('button', { name: 'Open a case' }).click();
    const form = priya.getByRole('form', { name: `Open a case for ${NAME}` });
    await form.getByRole('checkbox', { name: 'Lower back', exact: true }).check();
    await form.getByLabel('Onset date').fill(isoDay(-3));
    await form.getByLabel('Status', { exact: true }).selectOption('limited');
    await form.getByLabel('Status from').fill(isoDay(0));
    await form.getByRole('button', { name: 'Save case' }).click();
    await expect(priya).toHaveURL(/\/clinician\/cases\/[0-9a-f-]{36}$/);
    await priya.getByRole('button', { name: 'Write the restriction plan' }).click();
    const editor = priya.getByRole('form', { name: 'Write the restriction plan' });
    await fillStageDates(stageFieldset(priya, 1), { start: isoDay(-1), end: isoDay(27) });
    await setPattern(stageFieldset(priya, 1), 'Hinge', 'Capped', { 'max % of 1RM': '60' });
    await editor.getByRole('button', { name: 'Save plan' }).click();
    await expect(priya.getByRole('tabpanel')).toContainText('Version 1, saved');

    // The Limited letter, signed: it lists the limit in force and is current.
    const draft = await writeDraftLetter(priya, NAME, {
      decision: 'Limited participation',
      from: isoDay(0),
      credential: 'ATC',
      licenceNumber: 'AT-12345',
    });
    await expect(draft.getByLabel('Limit 1', { exact: true })).toHaveValue(HINGE_60);
    await signDraftLetter(priya, draft, 'Priya Raman');
    const letters = lettersSection(priya);
    const inForce = letters.getByRole('article').filter({ hasText: 'Limited participation' }).first();
    await expect(inForce).toBeVisible();
    await expect(letters.getByText('Out of date', { exact: true })).toHaveCount(0);

    // Priya tightens the plan: the letter no longer says what is in force.
    await priya.getByRole('button', { name: 'Edit plan' }).click();
    const edit = priya.getByRole('form', { name: 'Edit the restriction plan' });
    await stageFieldset(priya, 1).getByLabel('Hinge max % of 1RM', { exact: true }).fill('50');
    await edit.getByRole('button', { name: 'Save plan' }).click();
    await expect(priya.getByRole('status').filter({ hasText: 'Version 2 saved.' })).toBeVisible();
    await expect(letters.getByText('Out of date', { exact: true })).toBeVisible();
    await expect(letters).toContainText('the plan or status changed after this letter was signed');
    await keepScreenshot(priya, testInfo, 'letter-out-of-date');

    // One click: the updated letter's form, filled in from the plan now in force.
    await letters.getByRole('button', { name: 'Write the updated letter' }).click();
    const updated = letters.getByRole('form', { name: `Write a clearance letter for ${NAME}` });
    await expect(updated.getByRole('radio', { name: 'Limited participation', exact: true })).toBeChecked();
    await expect(updated.getByLabel('From', { exact: true })).toHaveValue(isoDay(0));
    await expect(updated.getByLabel('Credential', { exact: true })).toHaveValue('ATC');
    await expect(updated.getByLabel('Licence number', { exact: true })).toHaveValue('AT-12345');
    await expect(updated).toContainText(HINGE_50);
    await updated.getByRole('button', { name: 'Save draft letter' }).click();
    const newDraft = letters.getByRole('article', { name: 'Draft letter: Limited participation' });
    await expect(newDraft.getByLabel('Limit 1', { exact: true })).toHaveValue(HINGE_50);
    await signDraftLetter(priya, newDraft, 'Priya Raman');

    // The updated letter is in force and current: no out-of-date mark is left.
    await expect(letters.getByText('Out of date', { exact: true })).toHaveCount(0);
    await expect(letters.getByRole('button', { name: 'Write the updated letter' })).toHaveCount(0);
    await expect(letters).toContainText(HINGE_50);
  } finally {
    await priyaContext.close();
  }
});
