import { expect, test, type Page } from '@playwright/test';
import {
  DEMO,
  HOME_HEADING,
  SLOW_HASH_MS,
  acceptInvitation,
  createInvitation,
  expectHome,
  expectNoSidewaysScroll,
  keepScreenshot,
  signIn,
  uniqueEmail,
} from './helpers';

/**
 * The foundation release, end to end in a real browser against the built app and the demo scenario:
 * signing in and out as each role, refusals in words, invitations, care teams, the account page,
 * the content security policy and session persistence. The screens people use on a phone run in both
 * projects (desktop and a 375 px phone); the rest on desktop only. Tests share one database per run,
 * so each one invites its own people or changes only demo accounts no other test changes.
 */

const isPhone = (page: Page) => (page.viewportSize()?.width ?? 1280) <= 400;

const ROLE_ACCOUNTS = [
  { role: 'admin', person: DEMO.admin },
  { role: 'coach', person: DEMO.coachTheo },
  { role: 'clinician', person: DEMO.clinicianPriya },
  { role: 'athlete', person: DEMO.maya },
  { role: 'guardian', person: DEMO.elena },
] as const;

test.describe('each role signs in, sees its home, and signs out', () => {
  for (const { role, person } of ROLE_ACCOUNTS) {
    test(`${role}: ${person.name}`, async ({ page }, testInfo) => {
      await signIn(page, person.email);
      await expectHome(page, HOME_HEADING[role]);
      await expect(page.getByRole('banner')).toContainText(person.name);

      if (role === 'admin') {
        const admin = page.getByRole('navigation', { name: 'Administration' });
        for (const link of ['People', 'Invitations', 'Audit trail']) {
          await expect(admin.getByRole('link', { name: link })).toBeVisible();
        }
        await expect(page.getByRole('link', { name: DEMO.maya.name })).toBeVisible();
      }
      if (role === 'coach' || role === 'clinician') {
        // Both Theo and Priya look after Maya in the demo scenario (Priya's caseload also links her report).
        await expect(page.getByRole('cell', { name: DEMO.maya.name }).first()).toBeVisible();
      }
      if (role === 'athlete' || role === 'guardian') {
        await expect(page.getByRole('heading', { name: 'Warning signs', exact: true })).toBeVisible();
        await expect(page.getByText(DEMO.maya.name).first()).toBeVisible();
      }

      if (isPhone(page)) await expectNoSidewaysScroll(page);
      await keepScreenshot(page, testInfo, `home-${role}`);

      await page.getByRole('button', { name: 'Sign out' }).click();
      await expect(page.getByRole('heading', { name: 'Sign in to Loadline' })).toBeVisible();
      await expect(page).toHaveURL(/\/sign-in$/);
      if (isPhone(page)) await expectNoSidewaysScroll(page);

      // Signed out for real: a signed-in page sends us back to sign in.
      await page.goto('/');
      await expect(page.getByRole('heading', { name: 'Sign in to Loadline' })).toBeVisible();
    });
  }
});

test('an invited coach accepts once, lands on their home, and the link then stops working', async ({ page, browser }, testInfo) => {
  const email = uniqueEmail(testInfo, 'coach');
  await signIn(page, DEMO.admin.email);
  const link = await createInvitation(page, { email, roles: ['Coach'] });
  expect(new URL(link).origin).toBe(new URL(page.url()).origin);

  const invitee = await acceptInvitation(browser, testInfo, link, 'Quinn Harbor');
  try {
    await expectHome(invitee, HOME_HEADING.coach);
    await expect(invitee).toHaveURL(/\/coach$/);
    await expect(invitee.getByRole('banner')).toContainText('Quinn Harbor');
    await expect(invitee.getByRole('banner')).toContainText(email);
    if (isPhone(invitee)) await expectNoSidewaysScroll(invitee);
  } finally {
    await invitee.context().close();
  }

  // Anyone opening the same link afterwards, from anywhere, is told it is used up.
  const again = await browser.newContext({ baseURL: testInfo.project.use.baseURL });
  try {
    const second = await again.newPage();
    await second.goto(link);
    await expect(second.getByRole('heading', { name: 'Accept your invitation' })).toBeVisible();
    await expect(second.getByRole('alert')).toContainText("This invitation can't be used");
    await expect(second.getByRole('button', { name: 'Accept invitation' })).toHaveCount(0);
  } finally {
    await again.close();
  }
});

test('the account page saves a switch to pounds', async ({ page }, testInfo) => {
  // One account per project: the database is shared by both projects in a run.
  const person = testInfo.project.name === 'phone' ? DEMO.luis : DEMO.sam;
  await signIn(page, person.email);
  await page.getByRole('link', { name: 'Account' }).click();
  await expectHome(page, 'Your account');
  await expect(page.getByLabel('Display name')).toHaveValue(person.name);
  const pounds = page.getByRole('radio', { name: 'Pounds (lb)' });
  await expect(page.getByRole('radio', { name: 'Kilograms (kg)' })).toBeChecked();
  await pounds.check();
  await page.getByRole('button', { name: 'Save account' }).click();
  await expect(page.getByRole('status').filter({ hasText: 'Your account is saved.' })).toBeVisible();
  if (isPhone(page)) await expectNoSidewaysScroll(page);

  await page.reload();
  await expectHome(page, 'Your account');
  await expect(page.getByRole('radio', { name: 'Pounds (lb)' })).toBeChecked();
});

/*
 * These do not depend on the screen size, so they run on the desktop project only: every sign-in
 * costs a bcrypt check (about 2 s on a small CI machine) and the run should stay near 2 minutes.
 */
test.describe('desktop only', () => {
  test.skip(({ isMobile }) => isMobile, 'independent of screen size; covered by the desktop project');

  test('a wrong password is refused with a message that does not say which part was wrong', async ({ page }) => {
    await page.goto('/sign-in');
    await page.getByLabel('E-mail').fill(DEMO.admin.email);
    await page.getByLabel('Password').fill('not-the-demo-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect(page.getByRole('alert')).toHaveText('E-mail or password is incorrect.', { timeout: SLOW_HASH_MS });
    await expect(page.getByRole('heading', { name: 'Sign in to Loadline' })).toBeVisible();
    await expect(page.getByRole('button', { name: 'Sign out' })).toHaveCount(0);
  });

  test('an athlete opening an admin page reads why they cannot', async ({ page }) => {
    await signIn(page, DEMO.jordan.email);
    await expectHome(page, HOME_HEADING.athlete);
    await page.goto('/admin/people');
    const refusal = page.getByRole('alert');
    await expect(refusal).toContainText("You can't do that: this page is for people with the admin role");
    await expect(page.getByRole('navigation', { name: 'Administration' })).toHaveCount(0);
    await expect(page.getByRole('heading', { name: 'People', exact: true })).toHaveCount(0);
    await refusal.getByRole('link', { name: 'Go to your home page' }).click();
    await expectHome(page, HOME_HEADING.athlete);
  });

  test('an admin adds a coach to an athlete’s care team and the coach then sees the athlete', async ({ page, browser }, testInfo) => {
    const email = uniqueEmail(testInfo, 'teamcoach');
    const coachName = `Care Coach ${testInfo.project.name} ${Date.now().toString(36)}`;
    await signIn(page, DEMO.admin.email);
    const link = await createInvitation(page, { email, name: coachName, roles: ['Coach'] });

    const coach = await acceptInvitation(browser, testInfo, link, coachName);
    try {
      await expectHome(coach, HOME_HEADING.coach);
      await expect(coach.getByText("You are not on any athlete's care team yet.")).toBeVisible();

      // A full load, so the admin's people list includes the coach who has just joined.
      await page.goto('/admin/people');
      await expectHome(page, 'People');
      await page.getByRole('link', { name: DEMO.maya.name }).click();
      await expectHome(page, DEMO.maya.name);
      const careTeam = page.getByRole('form', { name: 'Add to care team' });
      await careTeam.getByLabel('Care-team role').selectOption({ label: 'Coach' });
      await careTeam.getByLabel('Person').selectOption({ label: coachName });
      await careTeam.getByRole('button', { name: 'Add to care team' }).click();
      await expect(page.getByRole('button', { name: `Remove ${coachName} (coach) from the care team` })).toBeVisible();
      if (isPhone(page)) await expectNoSidewaysScroll(page);

      // The server reads care teams on every request, so a reload is enough.
      await coach.reload();
      await expectHome(coach, HOME_HEADING.coach);
      await expect(coach.getByRole('cell', { name: DEMO.maya.name })).toBeVisible();
      await expect(coach.getByRole('cell', { name: DEMO.jordan.name })).toHaveCount(0);
    } finally {
      await coach.context().close();
    }
  });

  test('the content security policy holds: no violations or console errors on sign-in and home', async ({ page }) => {
    const problems: string[] = [];
    page.on('console', (msg) => {
      if (msg.type() === 'error') problems.push(`console: ${msg.text()}`);
    });
    page.on('pageerror', (err) => problems.push(`page error: ${err.message}`));
    await page.addInitScript(() => {
      const w = window as unknown as { __cspViolations: string[] };
      w.__cspViolations = [];
      document.addEventListener('securitypolicyviolation', (e) => {
        w.__cspViolations.push(`${e.violatedDirective} blocked ${e.blockedURI || '(inline)'} at ${e.sourceFile}:${e.lineNumber}`);
      });
    });
    const violations = () => page.evaluate(() => (window as unknown as { __cspViolations: string[] }).__cspViolations);

    const response = await page.goto('/sign-in');
    expect(response?.headers()['content-security-policy']).toContain("script-src 'self'");
    await expect(page.getByRole('heading', { name: 'Sign in to Loadline' })).toBeVisible();
    expect(await violations()).toEqual([]);

    await signIn(page, DEMO.ava.email);
    await expectHome(page, HOME_HEADING.athlete);
    await expect(page.getByRole('heading', { name: 'Warning signs', exact: true })).toBeVisible();
    await page.getByRole('link', { name: 'Account' }).click();
    await expectHome(page, 'Your account');
    expect(await violations()).toEqual([]);
    expect(problems).toEqual([]);
  });

  test('a session survives a reload', async ({ page }) => {
    await signIn(page, DEMO.clinicianMarcus.email);
    await expectHome(page, HOME_HEADING.clinician);
    await page.reload();
    await expectHome(page, HOME_HEADING.clinician);
    await expect(page.getByRole('button', { name: 'Sign out' })).toBeVisible();
    await expect(page.getByRole('cell', { name: DEMO.sam.name })).toBeVisible();
    await page.goto('/');
    await expect(page).toHaveURL(/\/clinician$/);
  });
});
