import { expect, test, type Page } from '@playwright/test';
import pg from 'pg';
import { Secret, TOTP } from 'otpauth';
import {
  DEMO,
  NEW_PASSWORD,
  SLOW_HASH_MS,
  acceptInvitation,
  createInvitation,
  expectHome,
  keepScreenshot,
  signIn,
  uniqueEmail,
} from './helpers';

/**
 * Account security in the browser: a forgotten password reset through the e-mailed link (read from
 * the fake SMTP server's mailbox), and two-step sign-in set up on a clinician's account and then
 * used to sign in. Each test invites its own person, so no demo account's password or sign-in
 * changes for the other files.
 */

const isPhone = (page: Page) => (page.viewportSize()?.width ?? 1280) <= 400;

/** The newest password-reset e-mail to `to`, from the fake mailbox scripts/test.ts points us at. */
async function resetLinkFor(to: string): Promise<string> {
  const url = process.env.E2E_DATABASE_URL;
  if (!url) throw new Error('E2E_DATABASE_URL is not set: run the browser tests through scripts/test.ts');
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    const end = Date.now() + 30_000;
    for (;;) {
      const { rows } = await client.query<{ text_body: string }>(
        `SELECT text_body FROM fake_mailbox WHERE $1 = ANY(envelope_to) AND subject = 'Choose a new Loadline password' ORDER BY id DESC LIMIT 1`,
        [to],
      );
      const link = rows[0]?.text_body.match(/https?:\/\/\S+\/reset#[A-Za-z0-9_-]+/)?.[0];
      if (link) return link;
      if (Date.now() > end) throw new Error(`no reset e-mail reached ${to}`);
      await new Promise((r) => setTimeout(r, 250));
    }
  } finally {
    await client.end();
  }
}

async function signOut(page: Page) {
  await page.getByRole('button', { name: 'Sign out' }).click();
  await expect(page.getByRole('heading', { name: 'Sign in to Loadline' })).toBeVisible();
}

test('a person who forgot their password asks for a link, sets a new password from the e-mail and signs in with it', async ({
  page,
  browser,
}, testInfo) => {
  const email = uniqueEmail(testInfo, 'reset');
  await signIn(page, DEMO.admin.email);
  const invite = await createInvitation(page, { email, name: 'Reset Person', roles: ['Coach'] });
  const newcomer = await acceptInvitation(browser, testInfo, invite, 'Reset Person');
  await newcomer.context().close();
  await signOut(page);

  await page.getByRole('link', { name: 'Forgot your password?' }).click();
  await expect(page.getByRole('heading', { name: 'Forgot your password?' })).toBeVisible();
  await page.getByLabel('E-mail').fill(email);
  await page.getByRole('button', { name: 'Send me a link' }).click();
  await expect(page.getByRole('status')).toContainText('If that address belongs to a Loadline account');

  const link = await resetLinkFor(email);
  expect(new URL(link).pathname).toBe('/reset');
  await page.goto(link);
  await expect(page.getByRole('heading', { name: 'Choose a new password' })).toBeVisible();
  const chosen = 'harbour-lights-and-a-long-walk-home';
  await page.getByLabel('New password', { exact: true }).fill(chosen);
  await page.getByRole('button', { name: 'Save the new password' }).click();
  await expect(page.getByRole('heading', { name: 'Sign in to Loadline' })).toBeVisible({ timeout: SLOW_HASH_MS });
  await expect(page.getByRole('status')).toContainText('Your new password is saved');
  // The address bar no longer holds the used link.
  expect(page.url()).not.toContain('#');
  await keepScreenshot(page, testInfo, 'password-changed');

  // The old password no longer works; the new one does.
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(NEW_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('alert')).toContainText('E-mail or password is incorrect.', { timeout: SLOW_HASH_MS });
  await signIn(page, email, chosen);
  await expectHome(page, 'My athletes');

  // The link was used up.
  await signOut(page);
  await page.goto(link);
  await page.getByLabel('New password', { exact: true }).fill('another-long-passphrase-here');
  await page.getByRole('button', { name: 'Save the new password' }).click();
  await expect(page.getByRole('alert')).toContainText("This link can't be used", { timeout: SLOW_HASH_MS });
});

test('a clinician turns on two-step sign-in, then signs in with password and a code from the app', async ({ page, browser }, testInfo) => {
  test.skip(isPhone(page), 'clinician account settings are checked on the laptop layout');
  const email = uniqueEmail(testInfo, 'twostep');
  await signIn(page, DEMO.admin.email);
  const invite = await createInvitation(page, { email, name: 'Two Step Clinician', roles: ['Clinician'] });
  await signOut(page);
  const clin = await acceptInvitation(browser, testInfo, invite, 'Two Step Clinician');

  await clin.goto('/account');
  const section = clin.getByRole('region', { name: 'Two-step sign-in' });
  await section.getByRole('button', { name: 'Set up two-step sign-in' }).click();
  await expect(section.getByRole('img', { name: /QR code/ })).toBeVisible();
  const key = await section.getByLabel('Key for typing in by hand').inputValue();
  expect(key).toMatch(/^[A-Z2-7]{32}$/);
  const app = new TOTP({ algorithm: 'SHA1', digits: 6, period: 30, secret: Secret.fromBase32(key) });
  await keepScreenshot(clin, testInfo, 'two-step-setup');

  await section.getByLabel('Code from your app').fill(app.generate());
  await section.getByRole('button', { name: 'Switch on' }).click();
  const codes = section.getByRole('list', { name: 'Recovery codes' });
  await expect(codes.getByRole('listitem')).toHaveCount(10);
  await section.getByRole('button', { name: 'I have saved them' }).click();
  await expect(section).toContainText('On since');

  await clin.getByRole('button', { name: 'Sign out' }).click();
  await expect(clin.getByRole('heading', { name: 'Sign in to Loadline' })).toBeVisible();
  await clin.getByLabel('E-mail').fill(email);
  await clin.getByLabel('Password').fill(NEW_PASSWORD);
  await clin.getByRole('button', { name: 'Sign in' }).click();
  await expect(clin.getByRole('heading', { name: 'One more step' })).toBeVisible({ timeout: SLOW_HASH_MS });
  // Not signed in yet: the app itself stays closed until the code is given.
  await expect(clin.getByRole('button', { name: 'Sign out' })).toHaveCount(0);
  await keepScreenshot(clin, testInfo, 'two-step-code');

  // The next step's code: the one used to switch on cannot be used again.
  await clin.getByLabel('Sign-in code', { exact: true }).fill(app.generate({ timestamp: Date.now() + 30_000 }));
  await clin.getByRole('button', { name: 'Finish signing in' }).click();
  await expect(clin.getByRole('button', { name: 'Sign out' })).toBeVisible({ timeout: SLOW_HASH_MS });
  await expectHome(clin, 'My caseload');
  await clin.context().close();
});
