import { devices, expect, type Browser, type Locator, type Page, type TestInfo } from '@playwright/test';
import { RED_FLAG_ITEMS } from '../policies/red-flags';
import { BROWSER_ZONE } from './plan-helpers';

/**
 * A desktop browser (as in the desktop project) for the staff and guardian screens of a spec that
 * runs in the phone project, in the specs' browser zone (not the organization's).
 */
export async function newDesktopPage(browser: Browser, testInfo: TestInfo): Promise<Page> {
  const { viewport, userAgent, deviceScaleFactor, isMobile, hasTouch } = devices['Desktop Chrome'];
  const context = await browser.newContext({
    viewport,
    userAgent,
    deviceScaleFactor,
    isMobile,
    hasTouch,
    baseURL: testInfo.project.use.baseURL,
    timezoneId: BROWSER_ZONE,
  });
  return context.newPage();
}

/**
 * Chooses a radio drawn as a large button: the input itself is visually hidden and its label takes the
 * tap, so the label is what a finger (and Playwright) presses.
 */
async function press(page: Page, scope: Page | Locator, name: string): Promise<void> {
  const radio = scope.getByRole('radio', { name, exact: true });
  // `has` is matched inside each label, so it names the radio from the label, not from the page.
  await scope
    .locator('label')
    .filter({ has: page.getByRole('radio', { name, exact: true }) })
    .click();
  await expect(radio).toBeChecked();
}

/** One choice on a 0–10 scale, e.g. pickScore(page, 'Pain now', 3) — the radio named "Pain now 3". */
export async function pickScore(page: Page, label: string, n: number): Promise<void> {
  await press(page, page, `${label} ${n}`);
}

/** A Yes/No question drawn by YesNo: a radio group named by its question. */
export async function answerYesNo(page: Page, question: string, answer: 'Yes' | 'No'): Promise<void> {
  await press(page, page.getByRole('radiogroup', { name: question, exact: true }), answer);
}

export interface PainDetails {
  /** Names of the body-picture buttons, e.g. 'Lower back'. */
  regions: string[];
  now: number;
  worst: number;
  startedInTraining: 'Yes' | 'No';
  note?: string;
}

/** Step 1 of the report: where and how much. Leaves the page on step 1. */
export async function fillPainDetails(page: Page, details: PainDetails): Promise<void> {
  const where = page.getByRole('group', { name: 'Where does it hurt?' });
  for (const region of details.regions) {
    // The picture's button, not the tick box of the same name in the list under it.
    const button = where.getByRole('button', { name: region, exact: true });
    await button.click();
    await expect(button).toHaveAttribute('aria-pressed', 'true');
  }
  await pickScore(page, 'Pain now', details.now);
  await pickScore(page, 'Worst pain in the last 24 hours', details.worst);
  await answerYesNo(page, 'Did it start in training?', details.startedInTraining);
  if (details.note) await page.getByLabel('Anything else? (optional)').fill(details.note);
}

/**
 * Step 2: every warning question the chosen places ask answered, Yes for the ids given and No for the
 * rest. The screen depends on the places (back or pelvis adds the back questions), so it answers the
 * questions shown and checks that each id given Yes was among them.
 */
export async function answerWarningSigns(page: Page, yesIds: readonly string[] = []): Promise<void> {
  await expect(page.getByRole('heading', { name: 'Warning signs', exact: true })).toBeFocused();
  const shown: string[] = [];
  for (const item of RED_FLAG_ITEMS) {
    if ((await page.getByRole('radiogroup', { name: item.question, exact: true }).count()) === 0) continue;
    shown.push(item.id);
    await answerYesNo(page, item.question, yesIds.includes(item.id) ? 'Yes' : 'No');
  }
  for (const id of yesIds) expect(shown, `the question ${id} is on the screen`).toContain(id);
}

export function redFlagQuestion(id: string): string {
  const item = RED_FLAG_ITEMS.find((i) => i.id === id);
  if (!item) throw new Error(`no red-flag item ${id}`);
  return item.question;
}
