import { expect, type Browser, type Page, type TestInfo } from '@playwright/test';

/** The demo scenario loaded by scripts/test.ts (server/src/seed/demo.ts). */
export const DEMO_PASSWORD = 'harbor-point-demo-2026';

const at = (local: string) => `${local}@harborpoint.example`;

export const DEMO = {
  admin: { email: at('dana.okafor'), name: 'Dana Okafor' },
  coachTheo: { email: at('theo.lindqvist'), name: 'Theo Lindqvist' },
  coachRosa: { email: at('rosa.delgado'), name: 'Rosa Delgado' },
  clinicianPriya: { email: at('priya.raman'), name: 'Priya Raman, ATC' },
  clinicianMarcus: { email: at('marcus.bell'), name: 'Marcus Bell, DPT' },
  maya: { email: at('maya.torres'), name: 'Maya Torres' },
  jordan: { email: at('jordan.pike'), name: 'Jordan Pike' },
  sam: { email: at('sam.whitfield'), name: 'Sam Whitfield' },
  ava: { email: at('ava.chen'), name: 'Ava Chen' },
  luis: { email: at('luis.romero'), name: 'Luis Romero' },
  elena: { email: at('elena.torres'), name: 'Elena Torres' },
  wei: { email: at('wei.chen'), name: 'Wei Chen' },
} as const;

/**
 * Athletes with nothing under way (server/src/test/e2e-athletes.ts, loaded by scripts/test.ts), for
 * browser tests that walk a story from its start: the demo's own athletes are mid-season.
 */
export const CLEAN = {
  nora: { email: at('nora.ellis'), name: 'Nora Ellis' },
  ruth: { email: at('ruth.ellis'), name: 'Ruth Ellis' },
  kai: { email: at('kai.moreno'), name: 'Kai Moreno' },
} as const;

/** The heading each role's home opens with. */
export const HOME_HEADING = {
  admin: 'People',
  coach: 'My athletes',
  clinician: 'My caseload',
  athlete: 'My profile',
  guardian: 'Your athlete',
} as const;

/**
 * Passwords set through the app in a test (invitations, resets, sign-up) are checked at bcrypt's production
 * cost (about 2 s on a small, busy machine; the demo people's are stored cheaply, scripts/e2e-world.ts), so the steps
 * waiting on one get more than the default 5 s.
 */
export const SLOW_HASH_MS = 15_000;

/**
 * Signs in through the form, as a person would, and waits until the app has left the sign-in page.
 * Each call is one POST /api/session. Only failed sign-ins count against the server's limits (per
 * account, per address and account, and a high per-address ceiling), so successful ones are free.
 */
export async function signIn(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto('/sign-in');
  await expect(page.getByRole('heading', { name: 'Sign in to Loadline' })).toBeVisible();
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('button', { name: 'Sign out' })).toBeVisible({ timeout: SLOW_HASH_MS });
}

export async function expectHome(page: Page, heading: string): Promise<void> {
  await expect(page.getByRole('heading', { level: 1, name: heading, exact: true })).toBeVisible();
}

/** True when the page is wider than the viewport (a sideways scroll on a phone). */
export async function expectNoSidewaysScroll(page: Page): Promise<void> {
  const { scrollWidth, innerWidth } = await page.evaluate(() => ({
    scrollWidth: document.documentElement.scrollWidth,
    innerWidth: window.innerWidth,
  }));
  expect(scrollWidth, `page is ${scrollWidth}px wide in a ${innerWidth}px viewport`).toBeLessThanOrEqual(innerWidth + 1);
}

/** A unique address per test and project, so tests never collide within the shared e2e database. */
export function uniqueEmail(testInfo: TestInfo, label: string): string {
  const stamp = `${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}`;
  return `e2e-${label}-${testInfo.project.name}-${stamp}@harborpoint.example`;
}

export const NEW_PASSWORD = 'tidal-compass-lantern-2026';

/** As the signed-in admin, creates an invitation on the Invitations page and returns its link. */
export async function createInvitation(
  page: Page,
  invite: { email: string; name?: string; roles: ('Athlete' | 'Coach' | 'Clinician' | 'Guardian' | 'Admin')[] },
): Promise<string> {
  await page.goto('/admin/invitations');
  await expectHome(page, 'Invitations');
  const form = page.getByRole('form', { name: 'Invite someone' });
  await form.getByLabel('E-mail').fill(invite.email);
  if (invite.name) await form.getByLabel('Name (optional)').fill(invite.name);
  for (const role of invite.roles) await form.getByRole('checkbox', { name: role, exact: true }).check();
  await form.getByRole('button', { name: 'Create invitation' }).click();
  const link = page.getByLabel('Invitation link');
  await expect(link).toHaveValue(/\/invite#.+/);
  return link.inputValue();
}

/**
 * Opens an invitation link in a fresh browser context (no cookies, like the invitee's own phone),
 * accepts it, and returns the now signed-in page. The caller closes page.context().
 */
export async function acceptInvitation(browser: Browser, testInfo: TestInfo, link: string, name: string): Promise<Page> {
  const { viewport, isMobile, hasTouch, userAgent, deviceScaleFactor, baseURL } = testInfo.project.use;
  const context = await browser.newContext({ viewport, isMobile, hasTouch, userAgent, deviceScaleFactor, baseURL });
  const page = await context.newPage();
  await page.goto(link);
  await expect(page.getByRole('heading', { name: 'Accept your invitation' })).toBeVisible();
  await page.getByLabel('Your name').fill(name);
  await page.getByLabel('Password').fill(NEW_PASSWORD);
  await page.getByRole('button', { name: 'Accept invitation' }).click();
  await expect(page.getByRole('button', { name: 'Sign out' })).toBeVisible({ timeout: SLOW_HASH_MS });
  return page;
}

/** A full-page screenshot kept with the run's results for a human to look at; never compared. */
export async function keepScreenshot(page: Page, testInfo: TestInfo, name: string): Promise<void> {
  await page.screenshot({ path: testInfo.outputPath(`${name}-${testInfo.project.name}.png`), fullPage: true });
}
