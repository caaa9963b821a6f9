import { readFile } from 'node:fs/promises';
import { expect, type Download, type Locator, type Page } from '@playwright/test';

/** The shape of a verification code: 20 Crockford base32 characters in groups of four. */
export const CODE_PATTERN = /[0-9A-HJKMNP-TV-Z]{4}(?:-[0-9A-HJKMNP-TV-Z]{4}){4}/;

/** The clinician's "Clearance letters" section on an athlete or case page. */
export function lettersSection(page: Page): Locator {
  return page.getByRole('region', { name: 'Clearance letters' });
}

export interface LetterInput {
  decision: 'Full participation' | 'Limited participation';
  from: string;
  validUntil?: string;
  /** Left as the form fills them in (from the clinician's last letter) when undefined. */
  credential?: string;
  licenceNumber?: string;
  familyNote?: string;
}

/** Opens "Write a clearance letter", fills it in and saves the draft; returns the draft's article. */
export async function writeDraftLetter(page: Page, athleteName: string, letter: LetterInput): Promise<Locator> {
  const section = lettersSection(page);
  await section.getByRole('button', { name: 'Write a clearance letter' }).click();
  const form = section.getByRole('form', { name: `Write a clearance letter for ${athleteName}` });
  await form.getByRole('radio', { name: letter.decision, exact: true }).check();
  await form.getByLabel('From', { exact: true }).fill(letter.from);
  if (letter.validUntil !== undefined) await form.getByLabel('Valid until (next review)').fill(letter.validUntil);
  if (letter.credential !== undefined) await form.getByLabel('Credential', { exact: true }).fill(letter.credential);
  if (letter.licenceNumber !== undefined) await form.getByLabel('Licence number', { exact: true }).fill(letter.licenceNumber);
  if (letter.familyNote !== undefined) await form.getByLabel('Note for the family').fill(letter.familyNote);
  await form.getByRole('button', { name: 'Save draft letter' }).click();
  await expect(form).toHaveCount(0);
  const draft = section.getByRole('article', { name: `Draft letter: ${letter.decision}` });
  await expect(draft).toBeVisible();
  return draft;
}

/**
 * Types the signature on a saved draft and signs it; returns the verification code, read from the
 * notice that shows it this once.
 */
export async function signDraftLetter(page: Page, draft: Locator, signature: string): Promise<string> {
  const sign = draft.getByRole('form', { name: 'Sign and send the letter' });
  await sign.getByLabel('Type your full name to sign').fill(signature);
  await sign.getByRole('button', { name: 'Sign and send' }).click();
  const notice = lettersSection(page).getByRole('status').filter({ hasText: 'Verification code' });
  await expect(notice).toBeVisible();
  // The draft has become the letter in force: no draft is left to sign.
  await expect(draft).toHaveCount(0);
  const code = (await notice.textContent())?.match(CODE_PATTERN)?.[0];
  expect(code, 'a verification code in the notice').toBeTruthy();
  return code!;
}

/** Clicks a link that downloads a file and returns the download (the click must start exactly one). */
export async function downloadFrom(page: Page, link: Locator): Promise<Download> {
  const [download] = await Promise.all([page.waitForEvent('download'), link.click()]);
  return download;
}

/** The first bytes of a downloaded file, as text ("%PDF" for a PDF). */
export async function downloadHead(download: Download, bytes = 4): Promise<string> {
  const path = await download.path();
  return (await readFile(path)).subarray(0, bytes).toString('latin1');
}

/** The public check page's answer for a code (its heading is Valid, Superseded or Not found). */
export function checkAnswer(page: Page, heading: 'Valid' | 'Not yet in force' | 'Superseded' | 'Not found'): Locator {
  return page.getByRole('region', { name: heading, exact: true });
}
