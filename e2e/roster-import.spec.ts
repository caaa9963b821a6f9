import { readFile } from 'node:fs/promises';
import { expect, test, type Page } from '@playwright/test';
import { DEMO, expectHome, expectNoSidewaysScroll, keepScreenshot, signIn } from './helpers';

/**
 * Bringing a roster, in the browser: Dana, the demo admin, downloads the roster template, checks a file with
 * two problems (a bad e-mail, a minor without a guardian), fixes it, imports it through the server's
 * queue (after a reload between the check and the import), and imports the same file again, which
 * changes nothing. The people are this run's own (unique e-mails and names) and have no coach,
 * clinician or group, so no other spec sees them.
 */

test.skip(({ isMobile }) => isMobile, 'bringing a roster is a desk task; the desktop run covers it');

const HEADER =
  'name,email,date_of_birth,sport,position,groups,guardian1_name,guardian1_email,guardian2_name,guardian2_email,coach_emails,clinician_emails';

type Row = { name: string; email: string; dob?: string; sport?: string; guardian?: { name: string; email: string } };
const csv = (rows: Row[]) =>
  [
    HEADER,
    ...rows.map((r) =>
      [r.name, r.email, r.dob ?? '', r.sport ?? '', '', '', r.guardian?.name ?? '', r.guardian?.email ?? '', '', '', '', ''].join(','),
    ),
  ].join('\r\n');

async function check(page: Page, body: string) {
  await page.getByLabel('Roster file (CSV)').setInputFiles({ name: 'roster.csv', mimeType: 'text/csv', buffer: Buffer.from(body) });
  await page.getByRole('button', { name: 'Check the file' }).click();
  await expect(page.getByRole('heading', { name: 'What importing roster.csv would do' })).toBeVisible();
  // The result takes the focus, so a keyboard or screen reader user lands on it (WCAG 2.4.3, focus order).
  await expect(page.getByTestId('roster-preview')).toBeFocused();
}

const count = (page: Page, label: string) =>
  page.getByTestId('roster-counts').getByText(label, { exact: true }).locator('xpath=following-sibling::dd[1]');
const summary = (page: Page, label: string) =>
  page.getByTestId('roster-summary').getByText(label, { exact: true }).locator('xpath=following-sibling::dd[1]');

async function importAndWait(page: Page, rows: number) {
  await page.getByRole('button', { name: `Import ${rows} rows` }).click();
  await expect(page.getByTestId('roster-progress')).toBeFocused();
  // The queue's worker polls every second and imports 25 rows per batch: a few seconds here.
  await expect(page.getByRole('status').filter({ hasText: 'The import of roster.csv is done' })).toBeVisible({ timeout: 20_000 });
}

test('Dana brings a roster: the template, the problems, the fix, the import, and a second import that changes nothing', async ({
  page,
}, testInfo) => {
  const tag = `${Date.now().toString(36)}${Math.random().toString(36).slice(2, 5)}`;
  const at = (local: string) => `e2e-roster-${local}-${tag}@harborpoint.example`;
  const name = (first: string) => `${first} Rostered ${tag}`;
  const eve = { name: name('Eve'), email: at('eve'), dob: '2012-02-03' };
  const dee = { name: name('Dee'), email: 'dee-at-nowhere' };
  const rows: Row[] = [
    { name: name('Ada'), email: at('ada'), dob: '1995-03-02', sport: 'Rowing' },
    { name: name('Ben'), email: at('ben'), dob: '2011-06-01', guardian: { name: name('Gwen'), email: at('gwen') } },
    { name: name('Cal'), email: at('cal') },
    dee,
    eve,
    { name: name('Fay'), email: at('fay'), dob: '1999-11-30' },
  ];

  await signIn(page, DEMO.admin.email);
  await page.getByRole('navigation', { name: 'Administration' }).getByRole('link', { name: 'Bring a roster' }).click();
  await expectHome(page, 'Bring a roster');
  // The columns' explanation wraps to a phone's width.
  const desk = page.viewportSize()!;
  await page.setViewportSize({ width: 375, height: 740 });
  await expectNoSidewaysScroll(page);
  await page.setViewportSize(desk);

  // The template comes from the server, with the columns it reads.
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download the template' }).click()]);
  expect(download.suggestedFilename()).toBe('loadline-roster-template.csv');
  const template = (await readFile(await download.path(), 'utf8')).split('\r\n');
  expect(template[0]).toBe(HEADER);
  expect(template[1]).toMatch(/^Sam Example,sam@example\.org,/);

  // A file the server cannot read as a roster is refused whole, with the reason on the file field.
  await page
    .getByLabel('Roster file (CSV)')
    .setInputFiles({ name: 'notes.csv', mimeType: 'text/csv', buffer: Buffer.from('first,second\r\n1,2') });
  await page.getByRole('button', { name: 'Check the file' }).click();
  await expect(page.getByRole('alert').filter({ hasText: 'The file was not checked' })).toContainText('Unknown columns: first, second.');
  await expect(page.getByLabel('Roster file (CSV)')).toHaveAttribute('aria-invalid', 'true');

  // A file with two problems: the preview names them (lines count the header as line 1).
  await check(page, csv(rows));
  await expect(count(page, 'New athletes')).toHaveText('4');
  await expect(count(page, 'With problems')).toHaveText('2');
  await expect(page.getByTestId('roster-row-5')).toContainText('E-mail must be a valid e-mail address.');
  await expect(page.getByTestId('roster-row-6')).toContainText(/Guardian 1 e-mail is required: the athlete is under 18 on /);
  await expect(page.getByRole('button', { name: 'Import 4 rows' })).toBeEnabled();
  await keepScreenshot(page, testInfo, 'roster-preview-problems');

  // The corrected file: nothing left out.
  dee.email = at('dee');
  Object.assign(eve, { guardian: { name: name('Hal'), email: at('hal') } });
  const fixed = csv(rows);
  await check(page, fixed);
  // A reload before importing keeps the checked file: the server holds it until it is imported.
  await page.reload();
  await expect(page.getByRole('heading', { name: 'What importing roster.csv would do' })).toBeVisible();
  await expect(page.getByRole('status').filter({ hasText: 'not imported yet' })).toBeVisible();
  await expect(count(page, 'New athletes')).toHaveText('6');
  await expect(count(page, 'With problems')).toHaveText('0');
  await page.getByRole('radio', { name: 'All rows (6)' }).check();
  await expect(page.getByTestId('roster-row-3')).toContainText(`Adds guardian ${name('Gwen')} and sends an invitation.`);
  await importAndWait(page, 6);
  await expect(summary(page, 'Athletes added')).toHaveText('6');
  await expect(summary(page, 'Invitations queued')).toHaveText('8');
  await keepScreenshot(page, testInfo, 'roster-imported');

  // The same file again: everyone is matched by e-mail, nothing is added and nobody is invited twice.
  await page.getByRole('button', { name: 'Check another file' }).click();
  await check(page, fixed);
  await expect(count(page, 'New athletes')).toHaveText('0');
  await expect(count(page, 'Already here, unchanged')).toHaveText('6');
  await importAndWait(page, 6);
  await expect(summary(page, 'Athletes added')).toHaveText('0');
  await expect(summary(page, 'Already here, unchanged')).toHaveText('6');
  await expect(summary(page, 'Invitations queued')).toHaveText('0');

  // Where admins see people, the new athletes are there.
  await page.getByRole('link', { name: 'See the people' }).click();
  await expectHome(page, 'People');
  await expect(page.getByText(name('Ada'), { exact: true })).toBeVisible();
});
