import { expect, test, type Page } from '@playwright/test';
import { DEMO, expectHome, signIn } from './helpers';
import { answerYesNo, pickScore } from './athlete-helpers';
import { contrastRatio, parseColor, textAndBackgrounds, worstContrast } from './contrast';

/**
 * Chosen answers must stay readable: WCAG 2.1 success criterion 1.4.3 (Contrast, Minimum) asks 4.5:1
 * between text and its background, with "relative luminance" and "contrast ratio" as WCAG 2.1 defines
 * them (e2e/contrast.ts). axe does not see these states (a chosen score, the pointer over it, a score
 * past the clinician's ceiling), so the colours are read from the page with getComputedStyle in each
 * state. Runs on the desktop and the phone (where a touch screen has no hover, so the hover check
 * measures the same resting colours).
 */

const AA_TEXT = 4.5;

/** The drawn face of a radio drawn as a large button: the span beside the hidden input in its label. */
function face(page: Page, radioName: string) {
  return page
    .locator('label')
    .filter({ has: page.getByRole('radio', { name: radioName, exact: true }) })
    .locator(':scope > span');
}

/** Contrast of the face at rest (pointer elsewhere) and under the pointer. */
async function measure(page: Page, radioName: string): Promise<{ resting: number; hovered: number }> {
  const target = face(page, radioName);
  await page.mouse.move(0, 0);
  const resting = worstContrast(await textAndBackgrounds(target));
  await target.hover();
  const hovered = worstContrast(await textAndBackgrounds(target));
  await page.mouse.move(0, 0);
  return { resting, hovered };
}

async function expectReadable(page: Page, radioName: string): Promise<void> {
  const { resting, hovered } = await measure(page, radioName);
  expect(resting, `${radioName}, at rest`).toBeGreaterThanOrEqual(AA_TEXT);
  expect(hovered, `${radioName}, under the pointer`).toBeGreaterThanOrEqual(AA_TEXT);
}

test('WCAG 2.1 "contrast ratio" and "relative luminance": the measure gives the known figures', () => {
  const white = parseColor('rgb(255, 255, 255)');
  // Black on white is the largest ratio the definition allows, 21:1.
  expect(contrastRatio(parseColor('rgb(0, 0, 0)'), white)).toBeCloseTo(21, 5);
  // #767676 on white is 4.54:1, the lightest grey passing 4.5:1 (WebAIM's contrast checker gives the same).
  expect(contrastRatio(parseColor('rgb(118, 118, 118)'), white)).toBeCloseTo(4.54, 2);
  // A gradient under the text is judged by its worst stop: paper text on light hatching fails.
  const worst = worstContrast({
    text: 'rgb(247, 243, 236)',
    layers: [['rgb(20, 32, 46)', 'rgb(236, 230, 219)', 'rgb(255, 253, 248)']],
  });
  expect(worst).toBeLessThan(1.2);
});

test('WCAG 2.1 SC 1.4.3: chosen, hovered and past-the-ceiling scores and answers keep 4.5:1 text contrast', async ({ page }) => {
  test.setTimeout(60_000);
  // Sam's demo plan has a stage in force with a pain ceiling, so the log marks the scores past it.
  await signIn(page, DEMO.sam.email);
  await page.goto('/athlete');
  await page.getByRole('link', { name: 'Log a session' }).click();
  await expectHome(page, 'Log a session');

  // The ceiling the form marks on "Pain during", from the stage in force.
  const legend = page.getByText(/Past your clinician.s ceiling of \d+\/10/).first();
  await expect(legend, 'the athlete needs a plan in force with a pain ceiling').toBeVisible();
  const ceiling = Number(/ceiling of (\d+)\/10/.exec((await legend.textContent()) ?? '')?.[1]);
  expect(ceiling).toBeLessThan(9);

  await pickScore(page, 'Pain before', 3);
  await expectReadable(page, 'Pain before 3');
  // An unchosen score beside it, for the hover fill.
  await expectReadable(page, 'Pain before 4');

  // Chosen past the ceiling: the number must sit on a solid fill, not under the hatching.
  await pickScore(page, 'Pain during', ceiling + 1);
  await expectReadable(page, `Pain during ${ceiling + 1}`);
  await expectReadable(page, `Pain during ${ceiling + 2}`);
  await expectReadable(page, 'Pain during 0');

  // The Yes/No answers of the pain report.
  await page.goto('/athlete');
  await page.getByRole('link', { name: 'Report pain' }).click();
  await expectHome(page, 'Report pain');
  await pickScore(page, 'Pain now', 2);
  await expectReadable(page, 'Pain now 2');
  await answerYesNo(page, 'Did it start in training?', 'Yes');
  const question = page.getByRole('radiogroup', { name: 'Did it start in training?', exact: true });
  await expect(question.getByRole('radio', { name: 'Yes', exact: true })).toBeChecked();
  for (const answer of ['Yes', 'No']) {
    const target = question
      .locator('label')
      .filter({ hasText: new RegExp(`^${answer}$`) })
      .locator(':scope > span');
    await page.mouse.move(0, 0);
    expect(worstContrast(await textAndBackgrounds(target)), `${answer}, at rest`).toBeGreaterThanOrEqual(AA_TEXT);
    await target.hover();
    expect(worstContrast(await textAndBackgrounds(target)), `${answer}, under the pointer`).toBeGreaterThanOrEqual(AA_TEXT);
  }
});
