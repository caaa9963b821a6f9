import { expect, test, type Page, type TestInfo } from '@playwright/test';
import pg from 'pg';
import { SLOW_HASH_MS, createInvitation, expectHome, expectNoSidewaysScroll, keepScreenshot, uniqueEmail } from './helpers';

/**
 * Organizations start themselves: the public page, the confirmation e-mail (read from the
 * fake SMTP server's mailbox), the first admin signing in; and one person in two organizations,
 * switching between them, with nothing of one visible in the other. Every organization and person
 * here is the test's own, so no demo account gains a second organization.
 */

const PASSWORD = 'north-shore-boathouse-2026';

// Each test hashes several passwords at the production bcrypt cost (sign-up, confirm, sign-in).
test.describe.configure({ timeout: 180_000 });

/** The newest sign-up confirmation e-mail to `to` for `organizationName`. */
async function confirmLinkFor(to: string, organizationName: string): Promise<string> {
  const url = process.env.E2E_DATABASE_URL;
  if (!url) throw new Error('E2E_DATABASE_URL is not set: run the browser tests through scripts/test.ts');
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    const end = Date.now() + 30_000;
    for (;;) {
      const { rows } = await client.query<{ text_body: string }>(
        `SELECT text_body FROM fake_mailbox WHERE $1 = ANY(envelope_to) AND subject = $2 ORDER BY id DESC LIMIT 1`,
        [to, `Confirm your e-mail to start ${organizationName} on Loadline`],
      );
      const link = rows[0]?.text_body.match(/https?:\/\/\S+\/start\/confirm#[A-Za-z0-9_-]+/)?.[0];
      if (link) return link;
      if (Date.now() > end) throw new Error(`no confirmation e-mail reached ${to}`);
      await new Promise((r) => setTimeout(r, 250));
    }
  } finally {
    await client.end();
  }
}

const orgName = (testInfo: TestInfo, label: string) => `${label} ${testInfo.project.name} ${Math.random().toString(36).slice(2, 6)}`;

/** Fills in and sends the public form; answers once the page says to check the e-mail. */
async function startOrganization(page: Page, o: { name: string; email: string; adminName: string }) {
  await page.goto('/start');
  await expect(page.getByRole('heading', { name: 'Start an organization' })).toBeVisible();
  await page.getByLabel('Organization name').fill(o.name);
  await page.getByLabel('Country').selectOption('NO');
  await page.getByLabel('Time zone').selectOption('Europe/Oslo');
  await page.getByLabel('Your name').fill(o.adminName);
  await page.getByLabel('E-mail').fill(o.email);
  await page.getByLabel('Password').fill(PASSWORD);
  await page.getByRole('button', { name: 'Start the organization' }).click();
  await expect(page.getByRole('status')).toContainText('we sent a link to that address', { timeout: SLOW_HASH_MS });
}

/** Opens the e-mailed link and confirms; answers on the sign-in page that follows. */
async function confirm(page: Page, email: string, name: string) {
  await page.goto(await confirmLinkFor(email, name));
  await expect(page.getByRole('heading', { name: 'Confirm your e-mail' })).toBeVisible();
  await page.getByRole('button', { name: 'Confirm and start the organization' }).click();
  await expect(page.getByRole('heading', { name: 'Sign in to Loadline' })).toBeVisible({ timeout: SLOW_HASH_MS });
  await expect(page.getByRole('status')).toContainText(`${name} is ready`, { timeout: SLOW_HASH_MS });
  // The address bar no longer holds the used link.
  expect(page.url()).not.toContain('#');
}

async function signInHere(page: Page, email: string) {
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('button', { name: 'Sign out' })).toBeVisible({ timeout: SLOW_HASH_MS });
}

test('a new organization starts from the sign-in page, its admin confirms the e-mail by the link, then signs in', async ({
  page,
}, testInfo) => {
  const email = uniqueEmail(testInfo, 'founder');
  const name = orgName(testInfo, 'Fjord Rowing');
  await page.goto('/sign-in');
  await page.getByRole('link', { name: 'Start an organization' }).click();
  await expect(page.getByRole('heading', { name: 'Start an organization' })).toBeVisible();
  if (testInfo.project.name === 'phone') {
    await page.setViewportSize({ width: 390, height: 844 });
    await expectNoSidewaysScroll(page);
    await keepScreenshot(page, testInfo, 'start-organization-390');
  }
  await startOrganization(page, { name, email, adminName: 'Ingrid Solberg' });
  await confirm(page, email, name);
  await signInHere(page, email);
  await expectHome(page, 'People');
  await expect(page.getByRole('banner')).toContainText(name);
  await expect(page.getByRole('banner')).toContainText('Ingrid Solberg');
  // Only the admin so far: the new organization holds nothing of the demo's.
  await expect(page.getByRole('main')).toContainText('Ingrid Solberg');
  await expect(page.getByRole('main')).not.toContainText('Maya Torres');
  await keepScreenshot(page, testInfo, 'new-organization-admin');
});

test('one person in two organizations switches between them, and nothing of one shows in the other', async ({ page }, testInfo) => {
  const email = uniqueEmail(testInfo, 'two-orgs');
  const alpha = orgName(testInfo, 'Alpha Club');
  const beta = orgName(testInfo, 'Beta Clinic');
  await startOrganization(page, { name: alpha, email, adminName: 'Sol Berg' });
  await confirm(page, email, alpha);
  // The same address starts a second organization: its existing account gains it.
  await startOrganization(page, { name: beta, email, adminName: 'Sol Berg' });
  await confirm(page, email, beta);
  await expect(page.getByRole('status')).toContainText('password you already use');
  await signInHere(page, email);

  const switcher = page.getByRole('combobox', { name: 'Organization' });
  await expect(switcher).toBeVisible();
  await switcher.selectOption({ label: alpha });
  await expect(page.getByRole('banner')).toContainText(alpha);
  const invitee = uniqueEmail(testInfo, 'alpha-only');
  await createInvitation(page, { email: invitee, name: 'Alpha Only', roles: ['Coach'] });
  await page.goto('/admin/invitations');
  await expect(page.getByRole('main')).toContainText(invitee);
  await page.goto('/admin/people');
  await expectHome(page, 'People');
  const alphaPersonUrl = await page.getByRole('link', { name: 'Sol Berg' }).first().getAttribute('href');

  await switcher.selectOption({ label: beta });
  await expect(switcher).toHaveValue(/.+/);
  await page.goto('/admin/invitations');
  await expectHome(page, 'Invitations');
  await expect(page.getByRole('main')).not.toContainText(invitee);
  await expect(page.getByRole('main')).not.toContainText('Alpha Only');
  // Alpha's record, opened while Beta is the organization in view, is not there.
  if (alphaPersonUrl) {
    await page.goto(alphaPersonUrl);
    await expect(page.getByRole('main')).toContainText('is not in your organization');
  }
  // The choice is kept: a reload stays in Beta.
  await page.reload();
  await expect(page.getByRole('combobox', { name: 'Organization' })).toHaveValue(await switcher.inputValue());
  await expect(page.getByRole('combobox', { name: 'Organization' }).locator('option:checked')).toHaveText(beta);
  await keepScreenshot(page, testInfo, 'two-organizations');
});
