import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page, type TestInfo } from '@playwright/test';
import { DEMO, HOME_HEADING, expectHome, signIn } from './helpers';
import { BROWSER_ZONE, isoDay } from './plan-helpers';

/**
 * An automated accessibility sweep (axe-core, WCAG 2.0 and 2.1 levels A and AA) over the main pages of
 * each role: every role's on the desktop project, the signed-out, athlete's and guardian's pages also on
 * the phone project (the people who use Loadline on a phone). A serious or critical violation fails the test;
 * moderate and minor ones, and axe's best-practice findings, are printed for a person to judge.
 *
 * The visits only read, with one exception: the demo has no program, so the program builder is reached
 * through one program for Jordan (Theo's athlete, whom no other spec programs) holding one empty draft
 * session a month ahead, made once per database and found again afterwards. Nothing is published, so
 * Jordan is shown nothing and nobody is notified.
 */

const TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'];
const BLOCKING = new Set(['serious', 'critical']);
const A11Y_PROGRAM = 'Accessibility check (e2e)';
const A11Y_SESSION = 'Accessibility session';
/** The demo's two plan templates (server/src/seed/demo-templates.ts): Priya's and Marcus's. */
const BACK_TEMPLATE = 'Low back, extension-related, young athlete (three stages)';
const ANKLE_TEMPLATE = 'Lateral ankle sprain (two stages)';

test.use({ timezoneId: BROWSER_ZONE });

type Visit = {
  path: string;
  heading?: string | RegExp;
  /** Brings the page into a state worth checking too (an open form, shown errors); never saves. */
  then?: { label: string; act: (page: Page) => Promise<void> };
};

/**
 * Runs axe on the page as it stands. Serious and critical WCAG violations are returned; moderate and
 * minor ones, and axe's best-practice findings (landmarks, heading order), become annotations.
 */
async function audit(page: Page, testInfo: TestInfo, label: string): Promise<string[]> {
  await expect(page.getByRole('status').filter({ hasText: /^Loading / })).toHaveCount(0);
  // One pass for both sets of rules: each run costs a second or more on a small machine.
  const { violations } = await new AxeBuilder({ page }).withTags([...TAGS, 'best-practice']).analyze();
  const isWcag = (v: (typeof violations)[number]) => v.tags.some((t) => TAGS.includes(t));
  const describe = (v: (typeof violations)[number]) =>
    `${label}: ${v.id} (${v.impact ?? 'no impact'}) ${v.help} — ${v.nodes
      .slice(0, 3)
      .map((n) => n.target.join(' '))
      .join(', ')}`;
  const blocking = violations.filter((v) => isWcag(v) && BLOCKING.has(v.impact ?? ''));
  for (const v of violations.filter((x) => !blocking.includes(x))) {
    testInfo.annotations.push({ type: 'a11y', description: describe(v) });
    console.log(`[a11y, not failing] ${testInfo.project.name} ${describe(v)}`);
  }
  return blocking.map(describe);
}

/** Visits each path in turn; one soft assertion per state so a run lists every page that fails. */
async function sweep(page: Page, testInfo: TestInfo, visits: Visit[]) {
  for (const visit of visits) {
    await page.goto(visit.path);
    const h1 = page.getByRole('heading', { level: 1, ...(visit.heading ? { name: visit.heading } : {}) });
    await expect(h1.first()).toBeVisible();
    expect.soft(await audit(page, testInfo, visit.path), `serious or critical axe violations on ${visit.path}`).toEqual([]);
    if (visit.then) {
      await visit.then.act(page);
      const label = `${visit.path} (${visit.then.label})`;
      expect.soft(await audit(page, testInfo, label), `serious or critical axe violations on ${label}`).toEqual([]);
    }
  }
}

/** Follows a link on the current page and returns where it led (ids come from the demo data). */
async function follow(page: Page, name: string, heading: string | RegExp): Promise<string> {
  await page.getByRole('link', { name, exact: true }).first().click();
  await expect(page.getByRole('heading', { level: 1, name: heading })).toBeVisible();
  return new URL(page.url()).pathname;
}

/** Presses a form's submit button with required fields left empty: the client refuses before sending. */
const submitEmpty = (button: string) => ({
  label: 'errors shown',
  act: async (page: Page) => {
    await page.getByRole('button', { name: button, exact: true }).click();
    await expect(page.locator('[aria-invalid="true"]').first()).toBeVisible();
  },
});

const open = (button: string, form: string) => ({
  label: `${form} open`,
  act: async (page: Page) => {
    await page.getByRole('button', { name: button, exact: true }).first().click();
    await expect(page.getByRole('form', { name: form })).toBeVisible();
  },
});

/** Staff pages are checked on the desktop; the phone project checks the athlete's and the guardian's. */
const STAFF_ON_DESKTOP = 'staff pages: checked on the desktop project';

test.describe('accessibility (axe, WCAG 2.1 A and AA)', () => {
  // Every page is loaded, settled and checked in turn.
  test.describe.configure({ timeout: 120_000 });

  test('signed-out pages', async ({ page }, testInfo) => {
    await sweep(page, testInfo, [
      { path: '/sign-in', heading: 'Sign in to Loadline', then: submitEmpty('Sign in') },
      { path: '/forgot-password' },
    ]);
  });

  test('admin', async ({ page }, testInfo) => {
    test.skip(testInfo.project.name === 'phone', STAFF_ON_DESKTOP);
    await signIn(page, DEMO.admin.email);
    await expectHome(page, HOME_HEADING.admin);
    await sweep(page, testInfo, [
      { path: '/admin/people', heading: 'People' },
      { path: '/admin/invitations', heading: 'Invitations', then: submitEmpty('Create invitation') },
      { path: '/admin/roster-import', heading: 'Bring a roster', then: submitEmpty('Check the file') },
      { path: '/admin/audit' },
      { path: '/admin/outbox' },
      { path: '/admin/settings' },
      { path: '/admin/injury-report', heading: 'Injury report' },
      { path: '/admin/plan-templates', heading: 'Plan templates' },
      { path: '/account' },
    ]);
    await page.goto('/admin/people');
    const person = await follow(page, DEMO.maya.name, DEMO.maya.name);
    await page.goto('/admin/plan-templates');
    const template = await follow(page, BACK_TEMPLATE, `Plan template: ${BACK_TEMPLATE}`);
    await sweep(page, testInfo, [
      { path: person, heading: DEMO.maya.name },
      // An admin may change any template: its editor is checked open (never saved).
      { path: template, heading: `Plan template: ${BACK_TEMPLATE}`, then: open('Edit template', 'Edit the plan template') },
    ]);
  });

  test('coach', async ({ page }, testInfo) => {
    test.skip(testInfo.project.name === 'phone', STAFF_ON_DESKTOP);
    await signIn(page, DEMO.coachTheo.email);
    await expectHome(page, HOME_HEADING.coach);
    await sweep(page, testInfo, [
      { path: '/coach', heading: HOME_HEADING.coach },
      { path: '/coach/exercises' },
      { path: '/staff/flags' },
      { path: '/account' },
    ]);
    await page.goto('/coach');
    const athlete = await follow(page, DEMO.jordan.name, DEMO.jordan.name);
    await sweep(page, testInfo, [
      { path: athlete, heading: DEMO.jordan.name, then: open('Record a 1RM or a set', 'Record a 1RM or a set') },
    ]);

    // The program builder, on the one draft program this spec keeps for Jordan.
    const existing = page.getByRole('link', { name: A11Y_PROGRAM, exact: true });
    if ((await existing.count()) === 0) {
      await page.getByRole('button', { name: 'New program' }).click();
      const form = page.getByRole('form', { name: 'New program' });
      expect.soft(await audit(page, testInfo, `${athlete} (New program open)`)).toEqual([]);
      await form.getByLabel('Program name').fill(A11Y_PROGRAM);
      const jordan = form.getByRole('checkbox', { name: DEMO.jordan.name, exact: true });
      if (!(await jordan.isChecked())) await jordan.check();
      await form.getByRole('button', { name: 'Create program' }).click();
      await expect(page).toHaveURL(/\/coach\/programs\/[0-9a-f-]{36}$/);
    } else {
      await existing.click();
    }
    await expectHome(page, A11Y_PROGRAM);
    const program = new URL(page.url()).pathname;
    // The session editor is the densest form in the app: one draft session, a month ahead, kept too.
    const editor = page.getByRole('region', { name: new RegExp(`^${A11Y_SESSION} ·`) });
    const listed = (p: Page) =>
      p
        .getByRole('list', { name: 'Weeks' })
        .getByRole('link', { name: new RegExp(`^${A11Y_SESSION}`) })
        .first();
    if ((await listed(page).count()) === 0) {
      const addSession = page.getByRole('form', { name: 'New session' });
      await addSession.getByLabel('Session date').fill(isoDay(30));
      await addSession.getByLabel('Session title').fill(A11Y_SESSION);
      await addSession.getByRole('button', { name: 'Add session' }).click();
      await expect(editor).toBeVisible();
    }
    await sweep(page, testInfo, [
      {
        path: program,
        heading: A11Y_PROGRAM,
        then: {
          label: 'session editor with the exercise picker open',
          act: async (p) => {
            await listed(p).click();
            await p
              .getByRole('region', { name: new RegExp(`^${A11Y_SESSION} ·`) })
              .getByRole('button', { name: 'Add exercise', exact: true })
              .click();
            await expect(p.getByRole('searchbox', { name: 'Find an exercise' })).toBeVisible();
          },
        },
      },
    ]);
  });

  test('clinician', async ({ page }, testInfo) => {
    test.skip(testInfo.project.name === 'phone', STAFF_ON_DESKTOP);
    await signIn(page, DEMO.clinicianMarcus.email);
    await expectHome(page, HOME_HEADING.clinician);
    await sweep(page, testInfo, [
      { path: '/clinician', heading: HOME_HEADING.clinician },
      { path: '/clinician/exceptions' },
      { path: '/clinician/audit' },
      { path: '/notices' },
      { path: '/staff/flags' },
      { path: '/clinician/injury-report', heading: 'Injury report' },
      { path: '/clinician/plan-templates', heading: 'Plan templates' },
      { path: '/account' },
    ]);
    // Marcus's own template (the demo's), with its editor open, never saved.
    await page.goto('/clinician/plan-templates');
    const template = await follow(page, ANKLE_TEMPLATE, `Plan template: ${ANKLE_TEMPLATE}`);
    await sweep(page, testInfo, [
      { path: template, heading: `Plan template: ${ANKLE_TEMPLATE}`, then: open('Edit template', 'Edit the plan template') },
    ]);
    await page.goto('/clinician');
    const athlete = await follow(page, DEMO.sam.name, DEMO.sam.name);
    const caseUrl = await follow(page, 'Right ankle / foot', 'Case: Right ankle / foot');
    await sweep(page, testInfo, [
      { path: athlete, heading: DEMO.sam.name },
      { path: caseUrl, heading: 'Case: Right ankle / foot', then: open('Edit plan', 'Edit the restriction plan') },
      { path: `${athlete.replace('/clinician/athletes/', '/staff/athletes/')}/workload` },
    ]);
  });

  test('athlete', async ({ page }, testInfo) => {
    await signIn(page, DEMO.sam.email);
    await expectHome(page, HOME_HEADING.athlete);
    await sweep(page, testInfo, [
      { path: '/athlete', heading: HOME_HEADING.athlete },
      {
        path: '/athlete/report',
        then: {
          label: 'errors shown',
          act: async (p) => {
            await p.getByRole('button', { name: 'Next: warning signs' }).click();
            await expect(p.getByText('Some answers are missing')).toBeVisible();
          },
        },
      },
      { path: '/athlete/check-in' },
      { path: '/athlete/log' },
      { path: '/athlete/week' },
      { path: '/athlete/documents' },
      { path: '/athlete/clips' },
      { path: '/account' },
    ]);
  });

  test('guardian', async ({ page }, testInfo) => {
    await signIn(page, DEMO.elena.email);
    await expectHome(page, HOME_HEADING.guardian);
    await sweep(page, testInfo, [{ path: '/guardian', heading: HOME_HEADING.guardian }, { path: '/notices' }, { path: '/account' }]);
  });
});
