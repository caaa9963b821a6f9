import { expect, test, type Page } from '@playwright/test';
import { DEMO, HOME_HEADING, expectHome, signIn } from './helpers';

/**
 * Loadline's own words on the pages people read: audit entries as sentences,
 * dates as "Thu 3 Dec 2026" (never YYYY-MM-DD in visible text), and labels in the trade's plain words.
 */
const ISO_DATE = /\d{4}-\d{2}-\d{2}/;

/** The visible text of the page's main content once it has settled (no loading placeholders left). */
async function visibleText(page: Page): Promise<string> {
  await expect(page.getByText(/^Loading/)).toHaveCount(0);
  return page.locator('main').innerText();
}

async function expectNoIsoDate(page: Page, where: string): Promise<void> {
  const text = await visibleText(page);
  expect(text.match(ISO_DATE)?.[0], `an ISO date in the visible text of ${where}`).toBeUndefined();
}

test.describe('words on screens', () => {
  test('the admin reads the audit trail as sentences, verifies it, and sees no ISO date', async ({ page }) => {
    await signIn(page, DEMO.admin.email);
    await expectHome(page, HOME_HEADING.admin);
    await expectNoIsoDate(page, 'the people page');

    await page.goto('/admin/audit');
    await expectHome(page, 'Audit trail');
    const entries = page.getByRole('region', { name: 'Audit entries' });
    const filters = page.getByRole('form', { name: 'Filter the audit trail' });
    await filters.getByLabel('Action').fill('auth.signed_in');
    await filters.getByRole('button', { name: 'Apply filters' }).click();
    // "Dana Okafor signed in." — a sentence with the actor's name, not the code.
    await expect(entries.getByRole('cell', { name: `${DEMO.admin.name} signed in.`, exact: true }).first()).toBeVisible();
    await expect(entries.getByRole('cell', { name: 'auth.signed_in', exact: true })).toHaveCount(0);
    await expectNoIsoDate(page, 'the audit trail');

    await page.getByRole('button', { name: 'Verify the audit trail' }).click();
    await expect(page.getByText(/^The audit trail is intact: \d+ entries verified, none changed or missing\.$/)).toBeVisible();
    await expect(page.getByRole('button', { name: 'Check the chain' })).toHaveCount(0);
  });

  test("the coach's pages: the trade's words and no ISO date", async ({ page }) => {
    await signIn(page, DEMO.coachRosa.email);
    await expectHome(page, HOME_HEADING.coach);
    await expectNoIsoDate(page, "the coach's home");

    await page.getByRole('link', { name: DEMO.sam.name, exact: true }).first().click();
    await expect(page.getByRole('heading', { level: 1, name: DEMO.sam.name })).toBeVisible();
    await expect(page.getByRole('region', { name: 'What is allowed today' })).toBeVisible();
    await expect(page.getByRole('region', { name: 'Limits in force' })).toHaveCount(0);
    const athletePage = await visibleText(page);
    expect(athletePage).not.toMatch(/\b0 drafts\b/);
    expect(athletePage.match(ISO_DATE)?.[0], "an ISO date on the coach's athlete page").toBeUndefined();

    await page.goto('/coach/exercises');
    const library = await visibleText(page);
    expect(library).toContain('Available weight increments');
    expect(library).not.toMatch(/Load steps|1RM from|\bitself\b/);

    await page.goto('/staff/flags');
    const flags = await visibleText(page);
    expect(flags).not.toMatch(/PAIN RULE|Pain rule/i);
    expect(flags.match(ISO_DATE)?.[0], "an ISO date on the coach's flags").toBeUndefined();

    await page.goto('/notices');
    await expectNoIsoDate(page, "the coach's notices");
  });

  test("the clinician's pages: no ISO date, and the day picker reads 'What is allowed on'", async ({ page }) => {
    await signIn(page, DEMO.clinicianPriya.email);
    await expectHome(page, HOME_HEADING.clinician);
    await expectNoIsoDate(page, "the clinician's caseload");

    await page.getByRole('link', { name: DEMO.ava.name, exact: true }).first().click();
    await expect(page.getByRole('heading', { level: 1, name: DEMO.ava.name })).toBeVisible();
    await expect(page.getByRole('region', { name: 'What is allowed on' })).toBeVisible();
    await expect(page.getByRole('region', { name: 'In force on' })).toHaveCount(0);
    await expectNoIsoDate(page, "the clinician's athlete page");

    for (const path of ['/staff/flags', '/clinician/exceptions', '/clinician/audit', '/notices']) {
      await page.goto(path);
      await expectNoIsoDate(page, path);
    }
  });

  test("the athlete's and the guardian's pages carry no ISO date", async ({ page }) => {
    await signIn(page, DEMO.maya.email);
    await expectHome(page, HOME_HEADING.athlete);
    await expectNoIsoDate(page, "the athlete's home");
    for (const path of ['/athlete/week', '/notices']) {
      await page.goto(path);
      await expectNoIsoDate(page, path);
    }
    await page.getByRole('button', { name: 'Sign out' }).click();
    await expect(page.getByRole('heading', { name: 'Sign in to Loadline' })).toBeVisible();

    await signIn(page, DEMO.elena.email);
    await expectHome(page, HOME_HEADING.guardian);
    await expectNoIsoDate(page, "the guardian's home");
  });
});
