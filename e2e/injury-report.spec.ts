import { expect, test } from '@playwright/test';
import { DEMO, expectNoSidewaysScroll, signIn } from './helpers';

/**
 * The injury report (IOC consensus, Bahr et al. 2020) in the browser: Dana (admin) reads Harbor Point's
 * season injury report — totals with intervals, the chart, a breakdown with small rows withheld, the CSV —
 * and Theo records a practice for the softball infield in one step, unticking an absent athlete.
 */
test("an admin reads the season's injury report with small rows withheld and downloads the CSV", async ({ page }) => {
  await signIn(page, DEMO.admin.email);
  await page.goto('/admin/injury-report');
  await expect(page.getByRole('heading', { level: 1, name: 'Injury report' })).toBeVisible();
  const whole = page.getByRole('region', { name: 'Whole organization' });
  await expect(whole).toContainText('Time-loss injuries');
  await expect(whole).toContainText(/Incidence per 1,000 h \(95 % interval\)\d+\.\d\d \(\d+\.\d\d–\d+\.\d\d\)/);
  await expect(page.getByRole('img', { name: /injuries per 1,000 h/ })).toBeVisible();
  await page.getByLabel('Body region').check();
  const table = page.getByRole('table', { name: 'By body region' });
  await expect(table).toContainText('< 5');
  await expect(table).toContainText('Fewer than 5 injuries: numbers withheld');
  const download = page.waitForEvent('download');
  await page.getByRole('link', { name: 'Download CSV' }).click();
  expect((await download).suggestedFilename()).toMatch(/^loadline-injury-report-\d{4}-\d\d-\d\d-to-\d{4}-\d\d-\d\d\.csv$/);
  // On a phone the long labels of the totals wrap: nothing pushes the page sideways.
  await page.setViewportSize({ width: 375, height: 740 });
  await expect(whole).toContainText('Time-loss injuries');
  await expectNoSidewaysScroll(page);
});

test('a coach records a practice for the group in one step, with an absentee unticked', async ({ page }) => {
  await signIn(page, DEMO.coachTheo.email);
  await page.goto('/groups');
  await page.getByRole('link', { name: 'Softball infield' }).click();
  const form = page.getByRole('form', { name: 'Session hours' });
  const present = form.getByRole('group', { name: 'Present' });
  await expect(present.getByLabel(DEMO.maya.name)).toBeChecked();
  await present.getByLabel('Isla Brennan').uncheck();
  await form.getByLabel('Minutes').fill('75');
  await form.getByRole('button', { name: 'Record session hours' }).click();
  await expect(form.getByText(/75 minutes of practice on .* for 8 athletes\./)).toBeVisible();
});
