import { readFile } from 'node:fs/promises';
import { expect, test } from '@playwright/test';
import { Fhir } from 'fhir';
import ICAL from 'ical.js';
import pg from 'pg';
import { DEMO, HOME_HEADING, expectHome, signIn } from './helpers';
import { BROWSER_ZONE, contextOptions } from './plan-helpers';

/**
 * Records leave in open standards (iCalendar, RFC 5545; HL7 FHIR R4), in the browser.
 *
 * Maya turns on her private calendar feed on her account page; the address it shows serves an
 * iCalendar file (RFC 5545) that a separate parser (ical.js) reads, with her stage dates and without
 * her diagnosis or the clinician's notes; a new address stops the old one, and turning it off stops
 * the new one. Her feed ends off, as the demo has it.
 *
 * Elena, Maya's mother, turns on a feed of her own: Maya's planned sessions under "Maya:", with none of
 * the limits, stages or diagnosis, and turns it off again.
 *
 * Priya downloads Maya's case for a health record: the file is a FHIR R4 Bundle that FHIR.js validates
 * against the R4 definitions, with the patient, the condition, the pain scores (LOINC 72514-3), the
 * plan as a CarePlan and the clinician. Both read the demo as loaded and change nothing another spec
 * sees. Desktop only: the account page and the case screen are the same on a phone.
 */

test.skip(({ isMobile }) => isMobile, 'screens independent of size; one flow over the demo records');
test.use({ timezoneId: BROWSER_ZONE });

/** The parts of a FHIR R4 resource this spec reads (the whole file is checked by FHIR.js). */
interface Resource {
  resourceType: string;
  code?: { coding?: { system?: string; code?: string }[] };
  valueInteger?: number;
  valueQuantity?: { value?: number };
  bodySite?: unknown[];
}
interface Bundle {
  resourceType: string;
  entry?: { resource: Resource }[];
}

const DIAGNOSIS = 'Non-specific low back pain (demo)';
const CLINICAL_NOTE = 'tender over the right lumbar muscles';

async function mayasCaseId(): Promise<string> {
  const url = process.env.E2E_DATABASE_URL;
  if (!url) throw new Error('E2E_DATABASE_URL is not set: run the browser tests through scripts/test.ts');
  const db = new pg.Client({ connectionString: url });
  await db.connect();
  try {
    const { rows } = await db.query<{ case_id: string }>(
      `SELECT p.case_id FROM restriction_plans p JOIN memberships m ON m.id = p.athlete_id JOIN users u ON u.id = m.user_id WHERE u.email = $1`,
      [DEMO.maya.email],
    );
    return rows[0].case_id;
  } finally {
    await db.end();
  }
}

test('an athlete turns on a private calendar feed that an iCalendar parser reads, then replaces and revokes it', async ({
  browser,
}, testInfo) => {
  const context = await browser.newContext(contextOptions(testInfo));
  const page = await context.newPage();
  await signIn(page, DEMO.maya.email);
  await page.goto('/account');
  const panel = page.getByRole('region', { name: /Calendar feed/ });
  await panel.getByRole('button', { name: 'Turn on calendar feed' }).click();
  const address = panel.getByLabel('Your feed address (shown only now)');
  await expect(address).toHaveValue(/^https?:\/\/.+\.ics$/);
  const first = await address.inputValue();

  // The feed is public by its secret address (the server reads no session on it), as a phone's calendar reads it.
  const feed = await page.request.fetch(first);
  expect(feed.status()).toBe(200);
  expect(feed.headers()['content-type']).toContain('text/calendar');
  const text = await feed.text();
  const calendar = new ICAL.Component(ICAL.parse(text));
  expect(calendar.name).toBe('vcalendar');
  expect(calendar.getFirstPropertyValue('version')).toBe('2.0');
  const events = calendar.getAllSubcomponents('vevent');
  expect(events.length).toBeGreaterThan(0);
  // Every entry has what RFC 5545 §3.6.1 requires of a VEVENT: UID and DTSTAMP (and a start here).
  for (const e of events) {
    expect(String(e.getFirstPropertyValue('uid'))).toMatch(/@loadline$/);
    expect(e.getFirstPropertyValue('dtstamp')).toBeTruthy();
    expect(e.getFirstPropertyValue('dtstart')).toBeTruthy();
  }
  const summaries = events.map((e) => String(e.getFirstPropertyValue('summary')));
  expect(summaries.some((s) => s.includes('Settle'))).toBe(true);
  expect(text).not.toContain(DIAGNOSIS);
  expect(text).not.toContain(CLINICAL_NOTE);

  // A new address: the old one stops at once.
  await panel.getByRole('button', { name: 'Make a new address' }).click();
  await expect(address).not.toHaveValue(first);
  const second = await address.inputValue();
  expect((await page.request.fetch(first)).status()).toBe(404);
  expect((await page.request.fetch(second)).status()).toBe(200);

  // Off: the page says so and the address no longer works.
  await panel.getByRole('button', { name: 'Turn off' }).click();
  await expect(panel).toContainText('The feed is off; its address no longer works.');
  expect((await page.request.fetch(second)).status()).toBe(404);
  await context.close();
});

test("a guardian's feed lists the athlete's sessions under her first name, without limits or diagnosis", async ({ browser }, testInfo) => {
  const context = await browser.newContext(contextOptions(testInfo));
  const page = await context.newPage();
  await signIn(page, DEMO.elena.email);
  await expectHome(page, HOME_HEADING.guardian);
  await page.goto('/account');
  const panel = page.getByRole('region', { name: /Calendar feed/ });
  await expect(panel).toContainText('No diagnosis, notes or limits are in it');
  await panel.getByRole('button', { name: 'Turn on calendar feed' }).click();
  const address = panel.getByLabel('Your feed address (shown only now)');
  await expect(address).toHaveValue(/^https?:\/\/.+\.ics$/);
  const url = await address.inputValue();

  const text = await (await page.request.fetch(url)).text();
  const events = new ICAL.Component(ICAL.parse(text)).getAllSubcomponents('vevent');
  // The demo publishes Maya's coming week; each entry is hers, by first name, as RFC 5545 §3.6.1 asks (UID, DTSTAMP).
  expect(events.length).toBeGreaterThan(0);
  for (const e of events) {
    expect(String(e.getFirstPropertyValue('summary'))).toMatch(/^Maya: /);
    expect(e.getFirstPropertyValue('uid')).toBeTruthy();
    expect(e.getFirstPropertyValue('dtstamp')).toBeTruthy();
  }
  for (const secret of [DIAGNOSIS, CLINICAL_NOTE, 'Settle', 'With limits', '/10']) expect(text).not.toContain(secret);

  await panel.getByRole('button', { name: 'Turn off' }).click();
  await expect(panel).toContainText('The feed is off; its address no longer works.');
  expect((await page.request.fetch(url)).status()).toBe(404);
  await context.close();
});

test('a clinician downloads a case as a FHIR R4 Bundle that validates, with each part of the case', async ({ browser }, testInfo) => {
  const caseId = await mayasCaseId();
  const context = await browser.newContext({ ...contextOptions(testInfo), acceptDownloads: true });
  const page = await context.newPage();
  await signIn(page, DEMO.clinicianPriya.email);
  await expectHome(page, HOME_HEADING.clinician);
  await page.goto(`/clinician/cases/${caseId}`);
  const link = page
    .getByRole('region', { name: 'Health record export' })
    .getByRole('link', { name: 'Download for a health record (FHIR)' });
  const [download] = await Promise.all([page.waitForEvent('download'), link.click()]);
  const bundle = JSON.parse(await readFile(await download.path(), 'utf8')) as Bundle;

  // FHIR.js checks the Bundle against the R4 structure definitions.
  const result = new Fhir().validate(bundle);
  expect(result.messages.filter((m) => m.severity === 'error')).toEqual([]);
  expect(result.valid).toBe(true);
  expect(bundle.resourceType).toBe('Bundle');
  const resources = (bundle.entry ?? []).map((e) => e.resource);
  const types = new Set(resources.map((r) => r.resourceType));
  for (const t of ['Patient', 'Condition', 'Observation', 'CarePlan', 'Practitioner']) expect(types, t).toContain(t);
  // Pain scores are LOINC 72514-3 (pain severity, 0–10 verbal numeric rating) on the 0–10 scale.
  const pains = resources.filter((r) => r.resourceType === 'Observation');
  for (const o of pains) {
    expect(o.code?.coding?.[0]).toMatchObject({ system: 'http://loinc.org', code: '72514-3' });
    expect(o.valueInteger ?? o.valueQuantity?.value).toBeGreaterThanOrEqual(0);
  }
  const condition = resources.find((r) => r.resourceType === 'Condition');
  expect(condition?.bodySite?.length).toBeTruthy();
  // The clinician's notes stay in Loadline.
  expect(JSON.stringify(bundle)).not.toContain(CLINICAL_NOTE);
  await context.close();
});
