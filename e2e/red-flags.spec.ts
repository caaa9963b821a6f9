import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { RED_FLAG_ITEMS, TIER_HEADINGS, WARNING_TIERS } from '../policies/red-flags';
import { DEMO, HOME_HEADING, expectHome, expectNoSidewaysScroll, keepScreenshot, signIn } from './helpers';
import { fillPainDetails } from './athlete-helpers';

/**
 * The red-flag screen fits the body part (NICE NG59 2016, updated 2020; Finucane et al. 2020, JOSPT
 * 50(7):350–372): Jordan, a demo athlete no other spec reports for, opens the pain report, picks the
 * lower back and sees the back questions, then a knee instead and does not. Nothing is sent, so no
 * record changes. The warning-signs box on his page lists the report's two tiers, item for item.
 */

const BACK_ONLY = RED_FLAG_ITEMS.filter((i) => i.scope === 'back_or_pelvis');
const FOR_ALL = RED_FLAG_ITEMS.filter((i) => i.scope === 'all');
const BACK_GROUP = 'About your back, hips and legs';

const question = (page: Page, text: string) => page.getByRole('radiogroup', { name: text, exact: true });

/** Serious or critical WCAG 2.1 A/AA violations axe finds on the page as it stands (WCAG 2.1; axe-core). */
async function blockingA11y(page: Page): Promise<string[]> {
  const { violations } = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
  return violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => `${v.id}: ${v.help}`);
}

async function toWarningSigns(page: Page): Promise<void> {
  await page.getByRole('button', { name: 'Next: warning signs' }).click();
  await expect(page.getByRole('heading', { name: 'Warning signs', exact: true })).toBeFocused();
}

test('the warning-signs box lists the same two tiers and items as the report (NICE NG59; Finucane et al. 2020)', async ({
  page,
}, testInfo) => {
  await signIn(page, DEMO.jordan.email);
  await expectHome(page, HOME_HEADING.athlete);
  const box = page.getByRole('region', { name: 'Warning signs', exact: true });
  await expect(box).toBeVisible();
  for (const tier of WARNING_TIERS) {
    const part = box.getByRole('region', { name: TIER_HEADINGS[tier.tier], exact: true });
    await expect(part.getByRole('heading', { level: 3 })).toHaveText(TIER_HEADINGS[tier.tier]);
    await expect(part.getByRole('listitem')).toHaveText(tier.items.map((i) => i.sign));
  }
  await expect(box.getByRole('region', { name: TIER_HEADINGS.emergency })).toContainText('In an emergency call 911.');
  await expectNoSidewaysScroll(page);
  await box.scrollIntoViewIfNeeded();
  await keepScreenshot(page, testInfo, 'red-flags-warning-box');
  expect(await blockingA11y(page)).toEqual([]);
});

test('lower back → the back questions (cauda equina signs, bending backwards); a knee → only the questions for any pain', async ({
  page,
}, testInfo) => {
  await signIn(page, DEMO.jordan.email);
  await expectHome(page, HOME_HEADING.athlete);
  await page.getByRole('link', { name: 'Report pain' }).click();
  await expectHome(page, 'Report pain');

  await fillPainDetails(page, { regions: ['Lower back'], now: 3, worst: 4, startedInTraining: 'No' });
  await toWarningSigns(page);
  await expect(page.getByRole('heading', { name: BACK_GROUP })).toBeVisible();
  for (const item of [...BACK_ONLY, ...FOR_ALL]) await expect(question(page, item.question), item.id).toBeVisible();
  await expect(question(page, 'Do you have pain, numbness, tingling or weakness in both legs?')).toHaveCount(0);
  await expectNoSidewaysScroll(page);
  await keepScreenshot(page, testInfo, 'red-flags-back');
  expect(await blockingA11y(page)).toEqual([]);

  await page.getByRole('button', { name: 'Back to where and how much' }).click();
  const where = page.getByRole('group', { name: 'Where does it hurt?' });
  await where.getByRole('button', { name: 'Lower back', exact: true }).click();
  await expect(where.getByRole('button', { name: 'Lower back', exact: true })).toHaveAttribute('aria-pressed', 'false');
  await where.getByRole('button', { name: 'Left knee', exact: true }).click();
  await expect(where.getByRole('button', { name: 'Left knee', exact: true })).toHaveAttribute('aria-pressed', 'true');
  await toWarningSigns(page);
  await expect(page.getByRole('heading', { name: BACK_GROUP })).toHaveCount(0);
  for (const item of BACK_ONLY) await expect(question(page, item.question), item.id).toHaveCount(0);
  for (const item of FOR_ALL) await expect(question(page, item.question), item.id).toBeVisible();
  await expectNoSidewaysScroll(page);
  await keepScreenshot(page, testInfo, 'red-flags-knee');
});
