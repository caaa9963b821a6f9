import { expect, test } from '@playwright/test';
import { DEMO, HOME_HEADING, expectHome, expectNoSidewaysScroll, keepScreenshot, signIn } from './helpers';

/**
 * What a newcomer sees on a first start (server/src/seed/demo.ts): a season under way, not empty
 * screens. Each role signs in and finds the care loop of the demo's 16-year-old — her pain report read
 * by her clinician, her mother told of Limited in plain words, the plan change that left the signed
 * letter out of date and the updated letter sent — plus published sessions and eight weeks of charts.
 * Read-only: nothing here changes the demo, so it runs on both projects.
 */

test('Priya, the clinician, finds Maya’s report linked from her caseload and was told her letter went out of date', async ({
  page,
}, testInfo) => {
  await signIn(page, DEMO.clinicianPriya.email);
  await expectHome(page, HOME_HEADING.clinician);
  await page.getByRole('link', { name: /^Pain report of Maya Torres, 5\/10/ }).click();
  await expectHome(page, `Pain report: ${DEMO.maya.name}`);
  await expect(page.getByRole('main')).toContainText('Bending forward to field grounders hurts.');

  await page.goto('/notices');
  await expectHome(page, 'Notices');
  await expect(page.getByRole('main')).toContainText("Maya Torres's clearance letter is out of date");
  if (testInfo.project.name === 'phone') await expectNoSidewaysScroll(page);
  await keepScreenshot(page, testInfo, 'demo-clinician-notices');
});

test('Elena, Maya’s mother, was told of Limited in plain words and has the updated letter to read', async ({ page }, testInfo) => {
  await signIn(page, DEMO.elena.email);
  await expectHome(page, HOME_HEADING.guardian);
  await expect(page.getByRole('article', { name: 'Clearance letter for Maya' })).toBeVisible();
  await keepScreenshot(page, testInfo, 'demo-guardian-home');

  await page.goto('/notices');
  await expectHome(page, 'Notices');
  const main = page.getByRole('main');
  await expect(main).toContainText("Maya Torres's training status: Limited");
  // Plain words for the family: no "hinge", "RPE" or "1RM" in what she was told.
  const text = (await main.innerText()).toLowerCase();
  for (const word of ['hinge', 'rpe', '1rm', 'anti-rotation']) expect(text, `the family's notices say "${word}"`).not.toContain(word);
  if (testInfo.project.name === 'phone') await expectNoSidewaysScroll(page);
  await keepScreenshot(page, testInfo, 'demo-guardian-notices');
});

test('Theo, the coach, sees published sessions for his athletes and Maya’s lower-body session on hold', async ({ page }, testInfo) => {
  await signIn(page, DEMO.coachTheo.email);
  await expectHome(page, HOME_HEADING.coach);
  const maya = page.getByRole('row').filter({ hasText: DEMO.maya.name });
  const jordan = page.getByRole('row').filter({ hasText: DEMO.jordan.name });
  await expect(maya).toContainText('Limited');
  await expect(maya).toContainText('1 on hold');
  await expect(jordan).not.toContainText('none published');
  await keepScreenshot(page, testInfo, 'demo-coach-home');

  await jordan.getByRole('link', { name: DEMO.jordan.name }).click();
  await page.getByRole('link', { name: 'Workload and pain' }).click();
  await expectHome(page, 'Workload');
  await expect(page.getByRole('region', { name: 'Weekly load' }).locator('svg.recharts-surface')).toBeVisible();
  if (testInfo.project.name === 'phone') await expectNoSidewaysScroll(page);
  await keepScreenshot(page, testInfo, 'demo-coach-workload');
});
