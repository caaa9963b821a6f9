import { addDays, orgToday } from '../policies/today';
import { DEMO_TIME_ZONE } from '../server/src/seed/demo-zone';
import { expect, type Browser, type BrowserContextOptions, type Locator, type Page, type TestInfo } from '@playwright/test';

/**
 * A calendar day as 'YYYY-MM-DD', counted from the demo organization's today (its own time zone, as
 * the app counts it on both sides), so the specs agree with the app at any hour of the UTC day. Every
 * date a spec types or expects comes from here.
 */
export function isoDay(offsetDays = 0, now: Date = new Date()): string {
  return addDays(orgToday(DEMO_TIME_ZONE, now), offsetDays);
}

/**
 * The browsers' own time zone: never the demo organization's (America/Los_Angeles), so a spec passes
 * only if the app counts days in the organization's zone rather than the browser's. For much of the
 * UTC day, UTC's date is already the organization's tomorrow; athlete.spec.ts runs its phones in
 * Australia/Sydney, a day ahead of the organization for most of the day.
 */
export const BROWSER_ZONE = 'UTC';

/** The project's browser settings for a context made by hand (a second person, or a second tab as the same one). */
export function contextOptions(testInfo: TestInfo, extra: BrowserContextOptions = {}): BrowserContextOptions {
  const { viewport, isMobile, hasTouch, userAgent, deviceScaleFactor, baseURL } = testInfo.project.use;
  return { viewport, isMobile, hasTouch, userAgent, deviceScaleFactor, baseURL, timezoneId: BROWSER_ZONE, ...extra };
}

/** A 375 px phone, as in the phone project, for people who use the app on their phone. */
export async function newPhonePage(browser: Browser, testInfo: TestInfo): Promise<Page> {
  const context = await browser.newContext(
    contextOptions(testInfo, { viewport: { width: 375, height: 740 }, isMobile: true, hasTouch: true, userAgent: undefined }),
  );
  return context.newPage();
}

export type Mode = 'Blocked' | 'Capped' | 'Free';

/** The cap inputs of one pattern, by the words after the pattern's name in each input's label. */
export interface Caps {
  'max % of 1RM'?: string;
  'max load'?: string;
  'max RPE'?: string;
  'max sets per session'?: string;
  'max reps per set'?: string;
  'max hard sets per week'?: string;
}

/** One stage of the plan editor: the fieldset "Stage N". */
export function stageFieldset(page: Page, number: number): Locator {
  return page.getByRole('group', { name: `Stage ${number}`, exact: true });
}

/**
 * Sets one movement pattern's mode in a stage, then its caps (the inputs appear once it is Capped). A
 * stage shows only its limited patterns, so a pattern listed as "no limit" is first brought in with
 * "Add a limit for another movement" (setting one listed there to Free changes nothing).
 */
export async function setPattern(stage: Locator, pattern: string, mode: Mode, caps: Caps = {}): Promise<void> {
  const group = stage.getByRole('group', { name: `${pattern} mode`, exact: true });
  if ((await group.count()) === 0) {
    if (mode === 'Free') return;
    await stage.getByLabel('Add a limit for another movement', { exact: true }).selectOption({ label: pattern });
    await stage.getByRole('button', { name: 'Add limit', exact: true }).click();
    await expect(group).toBeVisible();
  }
  // The radios are drawn as a segmented control (the inputs are visually hidden): press the segment.
  await group
    .locator('label')
    .filter({ hasText: new RegExp(`^${mode}$`) })
    .click();
  await expect(group.getByRole('radio', { name: mode, exact: true })).toBeChecked();
  for (const [cap, value] of Object.entries(caps)) {
    await stage.getByLabel(`${pattern} ${cap}`, { exact: true }).fill(value);
  }
}

export interface StageInput {
  start: string;
  end: string;
  painCeiling?: string;
}

export async function fillStageDates(stage: Locator, input: StageInput): Promise<void> {
  await stage.getByLabel('Start date', { exact: true }).fill(input.start);
  await stage.getByLabel('End date', { exact: true }).fill(input.end);
  if (input.painCeiling !== undefined) await stage.getByLabel('Pain ceiling', { exact: true }).fill(input.painCeiling);
}

/** Everything the page holds as text, including closed <details> and screen-reader-only words. */
export async function pageText(page: Page): Promise<string> {
  return page.evaluate(() => document.body.textContent ?? '');
}

/**
 * Collects the bodies of the app's API responses on a page, so a test can say what the server sent
 * to this person — not only what the screen chose to show.
 */
export function recordApiBodies(page: Page): () => Promise<string> {
  const bodies: Promise<string>[] = [];
  page.on('response', (response) => {
    if (new URL(response.url()).pathname.startsWith('/api/')) bodies.push(response.text().catch(() => ''));
  });
  return async () => (await Promise.all(bodies)).join('\n');
}
