import { readFile } from 'node:fs/promises';
import { expect, test, type Page } from '@playwright/test';
import { strFromU8, unzipSync } from 'fflate';
import pg from 'pg';
import { CLEAN, DEMO_PASSWORD, SLOW_HASH_MS, keepScreenshot, signIn } from './helpers';

/**
 * A person's whole record in the browser: asked for on the account page, prepared by the server's
 * queue worker, e-mailed through the fake SMTP server (read here from its mailbox), and downloaded
 * from the e-mailed link as a ZIP that this test unpacks. Kai (an adult athlete) asks for his own;
 * Ruth asks for her daughter Nora's (a minor), opening the link signed out first.
 */

async function withDb<T>(work: (client: pg.Client) => Promise<T>): Promise<T> {
  const url = process.env.E2E_DATABASE_URL;
  if (!url) throw new Error('E2E_DATABASE_URL is not set: run the browser tests through scripts/test.ts');
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    return await work(client);
  } finally {
    await client.end();
  }
}

/** The newest record link e-mailed to `to` after `afterId` (the mailbox's last id before asking). */
async function recordLinkFor(to: string, afterId: number): Promise<string> {
  return withDb(async (client) => {
    const end = Date.now() + 60_000;
    for (;;) {
      const { rows } = await client.query<{ text_body: string }>(
        `SELECT text_body FROM fake_mailbox WHERE $1 = ANY(envelope_to) AND subject LIKE 'The copy of %record is ready' AND id > $2
          ORDER BY id DESC LIMIT 1`,
        [to, afterId],
      );
      const link = rows[0]?.text_body.match(/https?:\/\/\S+\/record-download\?org=[0-9a-f-]+#[A-Za-z0-9_-]{43}/)?.[0];
      if (link) return link;
      if (Date.now() > end) throw new Error(`no record e-mail reached ${to}`);
      await new Promise((r) => setTimeout(r, 250));
    }
  });
}

/** On the phone project, the screens are looked at 390 px wide (a common phone width). */
async function phoneWidth(page: Page) {
  if ((page.viewportSize()?.width ?? 1280) <= 400) await page.setViewportSize({ width: 390, height: 844 });
}

const lastMailId = () =>
  withDb(async (c) => Number((await c.query<{ id: string | null }>('SELECT max(id) AS id FROM fake_mailbox')).rows[0].id ?? 0));

/** Clicks the download button and unpacks the file the browser saved. */
async function downloadAndUnpack(page: Page): Promise<{ name: string; files: Record<string, Uint8Array> }> {
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download the record' }).click()]);
  const saved = await download.path();
  const files = unzipSync(new Uint8Array(await readFile(saved)));
  return { name: download.suggestedFilename(), files };
}

// Each test waits for the server's queue to build a ZIP and its e-mail to arrive: minutes on a busy machine.
test.describe.configure({ timeout: 180_000 });

/** A link, as the browser would open it, but on this test's own origin (the e-mail's host is the configured one). */
const onThisOrigin = (link: string) => {
  const u = new URL(link);
  return `${u.pathname}${u.search}${u.hash}`;
};

test('an athlete asks for their record on the account page, gets the e-mail, and downloads the ZIP', async ({ page }, testInfo) => {
  await phoneWidth(page);
  await signIn(page, CLEAN.kai.email);
  await page.goto('/account');
  const panel = page.getByRole('region', { name: 'Your records' });
  await expect(panel).toBeVisible();
  const before = await lastMailId();
  await panel.getByRole('button', { name: 'Download my record' }).click();
  await expect(page.getByRole('status').filter({ hasText: 'Asked.' })).toBeVisible();
  await expect(panel).toContainText('Preparing · Asked for');
  // The state moves on by itself while the page is open: preparing, then ready.
  await expect(panel).toContainText(/Ready · The link is in your e-mail\. It works until .+/, { timeout: 60_000 });
  await keepScreenshot(page, testInfo, 'record-export-account');

  const link = await recordLinkFor(CLEAN.kai.email, before);
  await page.goto(onThisOrigin(link));
  await expect(page.getByRole('heading', { name: 'Download a record' })).toBeVisible();
  await expect(page.getByRole('main')).toContainText(`${CLEAN.kai.name}'s record`);
  await keepScreenshot(page, testInfo, 'record-export-link');
  const { name, files } = await downloadAndUnpack(page);
  expect(name).toMatch(/^loadline-record-kai-moreno-\d{4}-\d{2}-\d{2}\.zip$/);
  expect(Object.keys(files)).toEqual(
    expect.arrayContaining(['README.txt', 'data/profile.json', 'data/cases.json', 'data/training-logs.json']),
  );
  expect(JSON.parse(strFromU8(files['data/profile.json']))).toMatchObject({ displayName: CLEAN.kai.name, isMinor: false });
  const everything = Object.values(files)
    .map((f) => Buffer.from(f).toString('latin1'))
    .join('\n');
  // Nobody else's record: not the other clean athlete, not her guardian.
  expect(everything).not.toContain(CLEAN.nora.name);
  expect(everything).not.toContain(CLEAN.ruth.name);
  await expect(page.getByRole('status').filter({ hasText: 'Downloaded.' })).toBeVisible();

  // Back on the account page the copy reads as downloaded.
  await page.goto('/account');
  await expect(page.getByRole('region', { name: 'Your records' })).toContainText('Downloaded · Downloaded');
});

test('a guardian asks for a minor’s record, opens the link signed out, signs in and downloads it; an expired link says so', async ({
  page,
  browser,
}, testInfo) => {
  await phoneWidth(page);
  await signIn(page, CLEAN.ruth.email);
  await page.goto('/account');
  const panel = page.getByRole('region', { name: 'Your records' });
  const before = await lastMailId();
  await panel.getByRole('button', { name: `Download ${CLEAN.nora.name}'s record` }).click();
  const link = await recordLinkFor(CLEAN.ruth.email, before);

  // Another browser, signed out (her phone): the page asks her to sign in, then comes back to the link.
  const { viewport, isMobile, hasTouch, userAgent, deviceScaleFactor, baseURL } = testInfo.project.use;
  const context = await browser.newContext({ viewport, isMobile, hasTouch, userAgent, deviceScaleFactor, baseURL });
  const phone = await context.newPage();
  try {
    await phone.goto(onThisOrigin(link));
    await phone.getByRole('link', { name: 'Sign in' }).click();
    await phone.getByLabel('E-mail').fill(CLEAN.ruth.email);
    await phone.getByLabel('Password').fill(DEMO_PASSWORD);
    await phone.getByRole('button', { name: 'Sign in' }).click();
    await expect(phone.getByRole('button', { name: 'Download the record' })).toBeVisible({ timeout: SLOW_HASH_MS });
    const { files } = await downloadAndUnpack(phone);
    expect(JSON.parse(strFromU8(files['data/profile.json']))).toMatchObject({ displayName: CLEAN.nora.name, isMinor: true });
    // A guardian's copy holds what a guardian may see: no pain reports or case documents.
    expect(JSON.parse(strFromU8(files['data/pain-reports.json']))).toEqual([]);
    expect(JSON.parse(strFromU8(files['data/documents.json']))).toEqual([]);
  } finally {
    await context.close();
  }

  // Seven days later the same link opens to a clear page, and no file.
  const token = new URL(link).hash.slice(1);
  await withDb((c) =>
    c.query(`UPDATE record_exports SET expires_at = now() - interval '1 minute' WHERE token_hash = encode(sha256($1::bytea), 'hex')`, [
      token,
    ]),
  );
  await page.goto(onThisOrigin(link));
  await expect(page.getByText('This link has expired', { exact: true })).toBeVisible();
  await expect(page.getByRole('main')).toContainText(`The copy of ${CLEAN.nora.name}'s record could be downloaded until`);
  await expect(page.getByRole('button', { name: 'Download the record' })).toHaveCount(0);
  await keepScreenshot(page, testInfo, 'record-export-expired');
});
