import { expect, test, type Page } from '@playwright/test';
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
import { answerWarningSigns, fillPainDetails, pickScore } from './athlete-helpers';
import { TIER_HEADINGS } from '../policies/red-flags';

/**
 * Phone first (issue 17, part 2): the app installs from Chromium, a session logged without signal is
 * kept on the phone and arrives once when the connection returns, the athlete's page reads from the
 * last visit marked with when it was updated, and emergency answers made offline show the
 * stop-and-get-care screen at once. Each test invites an athlete of its own, so no other spec sees
 * what it logs.
 */

/** Until the service worker is active and controls the page, a reload without signal has nothing to load. */
async function underServiceWorker(page: Page): Promise<void> {
  await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined));
  await page.reload();
  await expect.poll(() => page.evaluate(() => navigator.serviceWorker.controller !== null)).toBe(true);
}

async function freshAthlete(
  page: Page,
  browser: Parameters<typeof acceptInvitation>[0],
  testInfo: Parameters<typeof acceptInvitation>[1],
  name: string,
) {
  await signIn(page, DEMO.admin.email);
  const link = await createInvitation(page, { email: uniqueEmail(testInfo, 'offline'), name, roles: ['Athlete'] });
  return acceptInvitation(browser, testInfo, link, name);
}

/** How many of the athlete's own logs carry these notes, read from the API as the athlete. */
function logsWithNotes(page: Page, notes: string): Promise<number> {
  return page.evaluate(async (wanted) => {
    const session = (await (await fetch('/api/session')).json()) as { memberships: { id: string; organizationId: string }[] };
    const m = session.memberships[0];
    const logs = (await (await fetch(`/api/orgs/${m.organizationId}/training-logs?athleteId=${m.id}`)).json()) as {
      notes: string | null;
    }[];
    return logs.filter((l) => l.notes === wanted).length;
  }, notes);
}

test('installable: the manifest, our icons and the service worker; Chromium finds nothing stopping an install', async ({ page }) => {
  await page.goto('/sign-in');
  const manifestHref = await page.locator('link[rel="manifest"]').getAttribute('href');
  expect(manifestHref).toBe('/manifest.webmanifest');
  const manifest = await (await page.request.get(manifestHref!)).json();
  expect(manifest).toMatchObject({ name: 'Loadline', short_name: 'Loadline', display: 'standalone', start_url: '/' });
  for (const icon of manifest.icons as { src: string; type: string }[]) {
    const res = await page.request.get(icon.src);
    expect(res.status(), icon.src).toBe(200);
    expect(res.headers()['content-type']).toContain(icon.type.split('+')[0]);
  }
  const scope = await page.evaluate(() => navigator.serviceWorker.ready.then((r) => r.scope));
  expect(scope).toBe(new URL('/', page.url()).href);
  const cdp = await page.context().newCDPSession(page);
  const { installabilityErrors } = await cdp.send('Page.getInstallabilityErrors');
  // Playwright's contexts are incognito, which alone stops an install; nothing about the app may.
  expect(installabilityErrors.filter((e) => e.errorId !== 'in-incognito')).toEqual([]);
});

test('a session logged without signal is kept, marked on the page read from the last visit, and arrives once when back online', async ({
  page,
  browser,
}, testInfo) => {
  test.setTimeout(120_000);
  const athlete = await freshAthlete(page, browser, testInfo, 'Ines Offline');
  const context = athlete.context();
  try {
    await athlete.goto('/athlete');
    await expectHome(athlete, HOME_HEADING.athlete);
    await expect(athlete.getByRole('heading', { name: "Today's session" })).toBeVisible();
    await underServiceWorker(athlete);
    await expectHome(athlete, HOME_HEADING.athlete);

    // No signal: the page still opens, from the phone's copy, saying when it was last updated.
    await context.setOffline(true);
    await athlete.reload();
    await expectHome(athlete, HOME_HEADING.athlete);
    await expect(athlete.getByRole('status').filter({ hasText: /^Last updated / })).toBeVisible();
    await expect(athlete.getByText('Nothing is planned for you today.')).toBeVisible();
    await expectNoSidewaysScroll(athlete);
    await keepScreenshot(athlete, testInfo, 'offline-home');

    const notes = `Logged offline ${testInfo.project.name} ${Date.now()}`;
    await athlete.getByRole('link', { name: 'Log a session' }).first().click();
    await expectHome(athlete, 'Log a session');
    await athlete.getByLabel('Duration (minutes)').fill('40');
    await athlete.getByLabel('Session effort (0–10)').fill('4');
    await pickScore(athlete, 'Pain before', 1);
    await pickScore(athlete, 'Pain during', 2);
    await athlete.getByLabel('Notes (optional)').fill(notes);
    await athlete.getByRole('button', { name: 'Save session' }).click();
    await expect(athlete.getByRole('status').filter({ hasText: 'Saved on this phone' })).toBeVisible();
    await athlete.getByRole('link', { name: 'Back to my page' }).click();
    const kept = athlete.getByRole('region', { name: 'Kept on this phone' });
    await expect(kept).toContainText('One entry is waiting for signal.');
    await expect(kept).toContainText('Session log of');
    await expectNoSidewaysScroll(athlete);
    await keepScreenshot(athlete, testInfo, 'offline-kept');

    // Signal back: sent on its own, once.
    await context.setOffline(false);
    await expect(kept).toHaveCount(0, { timeout: 20_000 });
    await expect.poll(() => logsWithNotes(athlete, notes)).toBe(1);
    // A second visit's flush has nothing left to send: still one.
    await athlete.reload();
    await expectHome(athlete, HOME_HEADING.athlete);
    expect(await logsWithNotes(athlete, notes)).toBe(1);
  } finally {
    await context.close();
  }
});

test('emergency answers without signal show the stop-and-get-care screen at once, and the report is kept', async ({
  page,
  browser,
}, testInfo) => {
  test.setTimeout(120_000);
  const athlete = await freshAthlete(page, browser, testInfo, 'Oskar Offline');
  const context = athlete.context();
  try {
    await athlete.goto('/athlete/report');
    await expectHome(athlete, 'Report pain');
    await context.setOffline(true);
    await fillPainDetails(athlete, { regions: ['Lower back'], now: 6, worst: 8, startedInTraining: 'No' });
    await athlete.getByRole('button', { name: 'Next: warning signs' }).click();
    await answerWarningSigns(athlete, ['saddle_numbness']);
    await athlete.getByRole('button', { name: 'Send report' }).click();
    const screen = athlete.getByRole('dialog', { name: TIER_HEADINGS.emergency });
    await expect(screen).toBeVisible();
    await expect(screen.getByRole('heading', { name: TIER_HEADINGS.emergency })).toBeFocused();
    await expect(screen.getByRole('link', { name: /Call/ })).toBeVisible();
    await expect(screen.getByRole('status')).toContainText('Your report is kept on this phone.');
    await expectNoSidewaysScroll(athlete);
    await keepScreenshot(athlete, testInfo, 'offline-emergency');
    // Closed without signal: this athlete's report never leaves the phone, so no one else's view changes.
  } finally {
    await context.close();
  }
});
