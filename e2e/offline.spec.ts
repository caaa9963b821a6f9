import { randomUUID } from 'node:crypto';
import { expect, test, type Page } from '@playwright/test';
import pg from 'pg';
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
import { isoDay } from './plan-helpers';
import { TIER_HEADINGS } from '../policies/red-flags';

/**
 * Phone first (the app works without signal): the app installs from Chromium, a session logged without signal
 * is kept on the phone and arrives once when the connection returns, the athlete's page reads from the last
 * visit marked with when it was updated, and emergency answers made offline show the stop-and-get-care screen
 * at once. Each test invites an athlete of its own, so no other spec sees what it logs.
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
  const email = uniqueEmail(testInfo, 'offline');
  const link = await createInvitation(page, { email, name, roles: ['Athlete'] });
  return { athlete: await acceptInvitation(browser, testInfo, link, name), email };
}

/** Fills the session log form's required answers, with notes to find the log by. */
async function fillLog(page: Page, notes: string): Promise<void> {
  await page.getByLabel('Duration (minutes)').fill('40');
  await page.getByLabel('Session effort (0–10)').fill('4');
  await pickScore(page, 'Pain before', 1);
  await pickScore(page, 'Pain during', 2);
  await page.getByLabel('Notes (optional)').fill(notes);
}

/**
 * A session published for the athlete today, in a program of its own, written by SQL as Theo would
 * have (he is put on the athlete's care team, so he may delete it later). No other spec sees it.
 */
async function plantTodaysSession(athleteEmail: string, title: string): Promise<{ orgId: string; sessionId: string }> {
  const url = process.env.E2E_DATABASE_URL;
  if (!url) throw new Error('E2E_DATABASE_URL is not set: run the browser tests through scripts/test.ts');
  const db = new pg.Client({ connectionString: url });
  await db.connect();
  try {
    const { rows } = await db.query<{ org_id: string; athlete_id: string; coach_id: string; exercise_id: string }>(
      `SELECT a.organization_id AS org_id, a.id AS athlete_id, c.id AS coach_id,
              (SELECT e.id FROM exercises e WHERE e.organization_id = a.organization_id AND NOT e.archived ORDER BY e.name LIMIT 1) AS exercise_id
         FROM memberships a JOIN users au ON au.id = a.user_id
         JOIN memberships c ON c.organization_id = a.organization_id JOIN users cu ON cu.id = c.user_id
        WHERE au.email = $1 AND cu.email = $2`,
      [athleteEmail, DEMO.coachTheo.email],
    );
    expect(rows).toHaveLength(1);
    const r = rows[0];
    await db.query(`INSERT INTO care_team_assignments (organization_id, athlete_id, member_id, role) VALUES ($1, $2, $3, 'coach')`, [
      r.org_id,
      r.athlete_id,
      r.coach_id,
    ]);
    const { rows: program } = await db.query<{ id: string }>(
      `INSERT INTO programs (organization_id, name, athlete_ids, version) VALUES ($1, $2, ARRAY[$3::uuid], 1) RETURNING id`,
      [r.org_id, `${title} program`, r.athlete_id],
    );
    const content = {
      exercises: [{ id: randomUUID(), exerciseId: r.exercise_id, sets: [{ id: randomUUID(), reps: 5, load: { kind: 'kg', value: 20 } }] }],
    };
    const { rows: session } = await db.query<{ id: string }>(
      `INSERT INTO program_sessions (organization_id, program_id, date, title, content, status, published_at, version)
       VALUES ($1, $2, $3, $4, $5::jsonb, 'published', now(), 1) RETURNING id`,
      [r.org_id, program[0].id, isoDay(0), title, JSON.stringify(content)],
    );
    return { orgId: r.org_id, sessionId: session[0].id };
  } finally {
    await db.end();
  }
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
  const { athlete } = await freshAthlete(page, browser, testInfo, 'Ines Offline');
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
    // The clearance-letter section reads from the copy too, rather than failing to load.
    await expect(athlete.getByText(/^No clearance letter yet\./)).toBeVisible();
    await expectNoSidewaysScroll(athlete);
    await keepScreenshot(athlete, testInfo, 'offline-home');

    const notes = `Logged offline ${testInfo.project.name} ${Date.now()}`;
    await athlete.getByRole('link', { name: 'Log a session' }).first().click();
    await expectHome(athlete, 'Log a session');
    await fillLog(athlete, notes);
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

    // Opened without signal on a later day: the copy is still there, marked with when it was saved and
    // that today's view may be out of date — never shown as the new day's own.
    await context.setOffline(true);
    await athlete.clock.setFixedTime(Date.now() + 26 * 3_600_000);
    await athlete.reload();
    await expectHome(athlete, HOME_HEADING.athlete);
    const stale = athlete.getByRole('status').filter({ hasText: /^Last updated / });
    await expect(stale).toContainText('so what it shows for today may be out of date. Check with your clinician before you train on it.');
    await expect(athlete.getByText('Nothing is planned for you today.')).toBeVisible();
    await expect(athlete.getByText(/, as saved on this phone$/)).toBeVisible();
  } finally {
    await context.close();
  }
});

test('emergency answers without signal show the stop-and-get-care screen at once, and the report is kept', async ({
  page,
  browser,
}, testInfo) => {
  test.setTimeout(120_000);
  const { athlete } = await freshAthlete(page, browser, testInfo, 'Oskar Offline');
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

test('a session log refused when it arrives (its session was deleted meanwhile) is shown with the reason and kept until the athlete acts', async ({
  page,
  browser,
}, testInfo) => {
  test.skip(!testInfo.project.use.isMobile, 'the weight-room case, on the phone; the outbox itself is the same on every screen');
  test.setTimeout(120_000);
  const { athlete, email } = await freshAthlete(page, browser, testInfo, 'Rhea Offline');
  const title = `Offline lift ${Date.now().toString(36)}`;
  const { orgId, sessionId } = await plantTodaysSession(email, title);
  const context = athlete.context();
  try {
    await athlete.goto('/athlete');
    await expectHome(athlete, HOME_HEADING.athlete);
    await expect(athlete.getByRole('article', { name: title })).toBeVisible();
    await underServiceWorker(athlete);
    await athlete.goto('/athlete/week');
    await expectHome(athlete, 'My week');

    await context.setOffline(true);
    await athlete.getByRole('link', { name: `Log this session: ${title}` }).click();
    await expectHome(athlete, 'Log a session');
    await expect(athlete.getByText(`From your plan: ${title}`)).toBeVisible();
    const notes = `Refused on arrival ${Date.now().toString(36)}`;
    await fillLog(athlete, notes);
    await athlete.getByRole('button', { name: 'Save session' }).click();
    await expect(athlete.getByRole('status').filter({ hasText: 'Saved on this phone' })).toBeVisible();

    // Meanwhile the coach deletes the session, through the API as a staff member.
    const staff = await browser.newContext({ baseURL: testInfo.project.use.baseURL });
    try {
      const coach = await staff.newPage();
      await signIn(coach, DEMO.coachTheo.email);
      const { csrfToken } = (await (await coach.request.get('/api/session')).json()) as { csrfToken: string };
      const deleted = await coach.request.delete(`/api/orgs/${orgId}/sessions/${sessionId}`, { headers: { 'X-CSRF-Token': csrfToken } });
      expect(deleted.ok(), await deleted.text()).toBe(true);
    } finally {
      await staff.close();
    }

    await athlete.getByRole('link', { name: '← My week' }).click();
    await expectHome(athlete, 'My week');
    await context.setOffline(false);
    const refused = athlete.getByRole('alert').filter({ hasText: /^Not accepted: Session log of / });
    await expect(refused).toBeVisible({ timeout: 20_000 });
    await expect(refused).toContainText('The planned session it was logged against is no longer in your program');
    await expect(refused).toContainText('It stays here until you send it again or discard it.');
    await expect(refused.getByRole('button', { name: 'Discard' })).toBeVisible();
    await expectNoSidewaysScroll(athlete);
    await keepScreenshot(athlete, testInfo, 'offline-refused');
    expect(await logsWithNotes(athlete, notes)).toBe(0);

    // Still there after a reload: nothing is dropped until the athlete acts.
    await athlete.reload();
    await expect(refused).toBeVisible();
    // The week settles first: a click while what is above still loads could land on the button below.
    await expectHome(athlete, 'My week');
    await expect(athlete.getByRole('status').filter({ hasText: /^Loading / })).toHaveCount(0);
    await refused.getByRole('button', { name: 'Send as a session of its own' }).click();
    await expect(athlete.getByRole('region', { name: 'Kept on this phone' })).toHaveCount(0, { timeout: 20_000 });
    await expect.poll(() => logsWithNotes(athlete, notes)).toBe(1);
  } finally {
    await context.close();
  }
});

test("the guardian's letters read from the last visit without signal, marked with when, and gone after sign-out", async ({
  page,
}, testInfo) => {
  test.skip(!testInfo.project.use.isMobile, "a parent's phone; the copy is the same on every screen");
  // Elena, Maya's mother in the demo, only reads: nothing another spec sees changes.
  await signIn(page, DEMO.elena.email);
  await expectHome(page, HOME_HEADING.guardian);
  const letter = page.getByRole('article', { name: `Clearance letter for ${DEMO.maya.name.split(' ')[0]}` });
  await expect(letter).toBeVisible();
  await underServiceWorker(page);
  await expectHome(page, HOME_HEADING.guardian);

  await page.context().setOffline(true);
  await page.reload();
  await expectHome(page, HOME_HEADING.guardian);
  await expect(page.getByRole('status').filter({ hasText: /^Last updated / })).toBeVisible();
  await expect(letter).toBeVisible();
  await expectNoSidewaysScroll(page);
  await keepScreenshot(page, testInfo, 'offline-guardian');

  await page.context().setOffline(false);
  await page.getByRole('button', { name: 'Sign out' }).click();
  await expect(page.getByRole('heading', { name: 'Sign in to Loadline' })).toBeVisible();
  const kept = await page.evaluate(() => Object.keys(localStorage).filter((k) => k.startsWith('loadline.offline.')));
  expect(kept).toEqual([]);
});
