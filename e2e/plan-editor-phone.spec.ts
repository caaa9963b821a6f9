import { expect, test, type Locator } from '@playwright/test';
import {
  DEMO,
  HOME_HEADING,
  acceptInvitation,
  createInvitation,
  expectHome,
  expectNoSidewaysScroll,
  keepScreenshot,
  signIn,
  uniqueEmail,
} from './helpers';
import { fillStageDates, isoDay, newPhonePage, setPattern, stageFieldset } from './plan-helpers';

/**
 * The restriction-plan editor on a 375 px phone shows the patterns a stage limits, each with its
 * controls, and lists the rest in one line as "no limit"; drawing all thirteen patterns made the page
 * about 9,700 px tall, far too long to work in on a phone. A clinician brings another movement in with
 * "Add a limit for another movement" and the plan saves it. Uses an athlete of its own, so no other
 * spec's plan changes.
 */

/**
 * The editor's own height (the case page around it holds other sections), for two stages that limit
 * two patterns: about 3,200 px here since each stage carries its exit-criteria buttons (about 250 px
 * a stage), against about 4,500 px when every pattern had its row.
 */
const MAX_EDITOR_HEIGHT = 3_600;

async function height(form: Locator): Promise<number> {
  const box = await form.boundingBox();
  if (!box) throw new Error('The plan editor is not on the page');
  return box.height;
}

test('on a phone the plan editor shows only the limited patterns, and a limit added for another movement is saved', async ({
  page,
  browser,
}, testInfo) => {
  test.skip(testInfo.project.name !== 'phone', 'the phone layout is what this measures');
  test.setTimeout(120_000);
  const stamp = Date.now().toString(36);
  const athleteName = `Noor Halvorsen ${stamp}`;

  // The admin invites an athlete of this spec's own and puts Marcus on the care team.
  await signIn(page, DEMO.admin.email);
  const link = await createInvitation(page, { email: uniqueEmail(testInfo, 'planphone'), name: athleteName, roles: ['Athlete'] });
  const athlete = await acceptInvitation(browser, testInfo, link, athleteName);
  await athlete.context().close();
  await page.goto('/admin/people');
  await expectHome(page, 'People');
  await page.getByRole('link', { name: athleteName }).click();
  await expectHome(page, athleteName);
  const careTeam = page.getByRole('form', { name: 'Add to care team' });
  await careTeam.getByLabel('Care-team role').selectOption({ label: 'Clinician' });
  await careTeam.getByLabel('Person').selectOption({ label: DEMO.clinicianMarcus.name });
  await careTeam.getByRole('button', { name: 'Add to care team' }).click();
  await expect(page.getByRole('button', { name: `Remove ${DEMO.clinicianMarcus.name} (clinician) from the care team` })).toBeVisible();

  const marcus = await newPhonePage(browser, testInfo);
  try {
    await signIn(marcus, DEMO.clinicianMarcus.email);
    await expectHome(marcus, HOME_HEADING.clinician);
    await marcus.getByRole('link', { name: athleteName, exact: true }).click();
    await expectHome(marcus, athleteName);
    await marcus.getByRole('button', { name: 'Open a case' }).click();
    const form = marcus.getByRole('form', { name: `Open a case for ${athleteName}` });
    await form.getByRole('checkbox', { name: 'Lower back', exact: true }).check();
    await form.getByLabel('Onset date').fill(isoDay(-2));
    await form.getByLabel('Status', { exact: true }).selectOption('limited');
    await form.getByLabel('Status from').fill(isoDay(0));
    await form.getByLabel('Review date').fill(isoDay(13));
    await form.getByRole('button', { name: 'Save case' }).click();
    await expectHome(marcus, 'Case: Lower back');

    // A plan of two stages limiting two patterns.
    await marcus.getByRole('button', { name: 'Write the restriction plan' }).click();
    const writer = marcus.getByRole('form', { name: 'Write the restriction plan' });
    const stage1 = stageFieldset(marcus, 1);
    await fillStageDates(stage1, { start: isoDay(0), end: isoDay(13), painCeiling: '4' });
    await setPattern(stage1, 'Hinge', 'Capped', { 'max % of 1RM': '60', 'max RPE': '7' });
    await setPattern(stage1, 'Jump / landing', 'Blocked');
    await writer.getByRole('button', { name: 'Add stage' }).click();
    const stage2 = stageFieldset(marcus, 2);
    await fillStageDates(stage2, { start: isoDay(14), end: isoDay(27) });
    await setPattern(stage2, 'Hinge', 'Capped', { 'max % of 1RM': '75' });
    await writer.getByRole('button', { name: 'Save plan' }).click();
    await expect(marcus.getByRole('tab', { name: 'Current plan' })).toHaveAttribute('aria-selected', 'true');

    await marcus.getByRole('button', { name: 'Edit plan' }).click();
    const editor = marcus.getByRole('form', { name: 'Edit the restriction plan' });
    const stage = stageFieldset(marcus, 1);
    await expect(stage.getByRole('group', { name: 'Hinge mode', exact: true })).toBeVisible();
    expect(await height(editor)).toBeLessThan(MAX_EDITOR_HEIGHT);
    await expect(stage.getByRole('group', { name: / mode$/ })).toHaveCount(2);
    await expect(stage.getByRole('group', { name: 'Squat mode', exact: true })).toHaveCount(0);
    await expect(stage.locator('p').filter({ hasText: /^No limit:/ })).toContainText('Squat');
    await expectNoSidewaysScroll(marcus);
    await keepScreenshot(marcus, testInfo, 'plan-editor-phone');

    // Bring Sprint in: it opens as Capped; block it instead, and save.
    await stage.getByLabel('Add a limit for another movement', { exact: true }).selectOption({ label: 'Sprint' });
    await stage.getByRole('button', { name: 'Add limit', exact: true }).click();
    const sprint = stage.getByRole('group', { name: 'Sprint mode', exact: true });
    await expect(sprint.getByRole('radio', { name: 'Capped', exact: true })).toBeChecked();
    await expect(stage.getByLabel('Sprint max % of 1RM', { exact: true })).toBeFocused();
    await setPattern(stage, 'Sprint', 'Blocked');
    await expect(stage.locator('p').filter({ hasText: /^No limit:/ })).not.toContainText('Sprint');
    expect(await height(editor)).toBeLessThan(MAX_EDITOR_HEIGHT);
    await editor.getByRole('button', { name: 'Save plan' }).click();

    const plan = marcus.getByRole('tabpanel');
    await expect(plan).toContainText('Version 2, saved');
    const view1 = plan.getByRole('listitem').filter({ has: marcus.getByRole('heading', { name: 'Stage 1' }) });
    await expect(view1.getByRole('row', { name: /Sprint/ })).toContainText('Blocked');
    await expect(view1.getByRole('row', { name: /Jump \/ landing/ })).toContainText('Blocked');
    await expect(view1.getByRole('row', { name: /Hinge/ })).toContainText('≤60% 1RM · RPE ≤7');
    await expect(view1.getByRole('row', { name: /Squat/ })).toHaveCount(0);
  } finally {
    await marcus.context().close();
  }
});
