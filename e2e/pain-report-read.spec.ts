import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Browser, type Page, type TestInfo } from '@playwright/test';
import type { SessionDto } from '../policies/dto';
import { RED_FLAG_ITEMS } from '../policies/red-flags';
import { DEMO, HOME_HEADING, expectHome, expectNoSidewaysScroll, keepScreenshot, signIn } from './helpers';
import { contextOptions, isoDay } from './plan-helpers';
import { apiWrite } from './uploads-helpers';

/**
 * The clinician reads the pain report the athlete was told "your clinician reads". The spec owns its
 * athlete: Dana (the demo admin) invites one per run and project, on Priya's (clinician) and Theo's
 * (coach) care team; the athlete files one report through the API (the report form is tested in
 * athlete.spec.ts). Nothing another spec reads is touched: the demo athletes file nothing here.
 */

const URGENT = RED_FLAG_ITEMS.find((i) => i.tier === 'urgent') ?? RED_FLAG_ITEMS[0];
const NO_ITEM = RED_FLAG_ITEMS.find((i) => i.id !== URGENT.id)!;

interface Cast {
  athleteName: string;
  reportId: string;
  note: string;
}

async function castWithReport(browser: Browser, testInfo: TestInfo): Promise<Cast> {
  const stamp = `${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}`;
  const admin = await (await browser.newContext(contextOptions(testInfo))).newPage();
  await signIn(admin, DEMO.admin.email);
  const orgId = ((await (await admin.request.get('/api/session')).json()) as SessionDto).memberships[0].organizationId;
  const people = (await (await admin.request.get(`/api/orgs/${orgId}/people`)).json()) as { id: string; email: string }[];
  const idOf = (email: string) => people.find((p) => p.email === email)!.id;

  const athleteName = `Report Reader ${stamp}`;
  const { link } = await apiWrite<{ link: string }>(admin.request, 'post', `/orgs/${orgId}/invitations`, {
    email: `e2e-painread-${stamp}@harborpoint.example`,
    roles: ['athlete'],
    dateOfBirth: '2004-05-06',
  });
  const athletePage = await (await browser.newContext(contextOptions(testInfo))).newPage();
  const session = await apiWrite<SessionDto>(athletePage.request, 'post', '/invitations/accept', {
    token: link.split('#')[1],
    displayName: athleteName,
    password: 'tidal-compass-lantern-2026',
  });
  const athleteId = session.memberships[0].id;
  for (const [email, role] of [
    [DEMO.clinicianPriya.email, 'clinician'],
    [DEMO.coachTheo.email, 'coach'],
  ] as const) {
    await apiWrite(admin.request, 'post', `/orgs/${orgId}/care-team`, { athleteId, memberId: idOf(email), role });
  }
  const note = `E2E-PAINREAD-NOTE ${stamp}: it aches after hinging and wakes me at night.`;
  const filed = await apiWrite<{ report: { id: string } }>(athletePage.request, 'post', `/orgs/${orgId}/pain-reports`, {
    athleteId,
    bodyRegions: ['lower_back'],
    painNow: 5,
    painWorst24h: 7,
    onsetDate: isoDay(-2),
    aggravatingPatterns: ['hinge'],
    startedInTraining: true,
    note,
    redFlags: Object.fromEntries(RED_FLAG_ITEMS.map((i) => [i.id, i.id === URGENT.id])),
  });
  await admin.context().close();
  await athletePage.context().close();
  return { athleteName, reportId: filed.report.id, note };
}

/** Serious or critical WCAG 2.1 A/AA violations axe finds on the page as it stands (as in accessibility.spec.ts). */
async function seriousAxeViolations(page: Page): Promise<string[]> {
  const { violations } = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
  return violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => `${v.id}: ${v.help}`);
}

async function expectTheWholeReport(page: Page, cast: Cast): Promise<void> {
  await expectHome(page, `Pain report: ${cast.athleteName}`);
  await expect(page).toHaveURL(new RegExp(`/pain-reports/${cast.reportId}$`));
  const answers = page.getByRole('region', { name: 'Warning-sign answers' });
  await expect(answers.getByRole('listitem').filter({ hasText: URGENT.question })).toContainText('Yes');
  await expect(answers.getByRole('listitem').filter({ hasText: NO_ITEM.question })).toContainText('No');
  await expect(answers.getByRole('listitem')).toHaveCount(RED_FLAG_ITEMS.length);
  await expect(page.getByRole('region', { name: 'In the athlete’s words' })).toContainText(cast.note);
  await expect(page.getByRole('region', { name: 'The pain' })).toContainText('5/10');
  await expect(page.getByRole('region', { name: 'What the app did' })).toContainText(DEMO.clinicianPriya.name);
}

test('Priya reads the whole report from her caseload, a flag, a notice and the athlete’s page, and opens a case linked to it; Theo (coach) sees no note and no answers', async ({
  browser,
}, testInfo) => {
  test.setTimeout(90_000);
  const cast = await castWithReport(browser, testInfo);

  const priya = await (await browser.newContext(contextOptions(testInfo))).newPage();
  await signIn(priya, DEMO.clinicianPriya.email);
  await expectHome(priya, HOME_HEADING.clinician);
  await priya.getByRole('link', { name: `Pain report of ${cast.athleteName}, 5/10` }).click();
  await expectTheWholeReport(priya, cast);
  await expectNoSidewaysScroll(priya);
  await keepScreenshot(priya, testInfo, 'pain-report-clinician');
  expect(await seriousAxeViolations(priya), 'WCAG 2.1 AA (axe-core) on the clinician’s pain-report page').toEqual([]);

  await priya.goto('/staff/flags');
  await expectHome(priya, 'Flags');
  const flag = priya.getByRole('row').filter({ has: priya.getByRole('link', { name: cast.athleteName, exact: true }) });
  await flag.getByRole('link', { name: 'Read the report' }).click();
  await expectTheWholeReport(priya, cast);

  await priya.goto('/notices');
  const notice = priya.getByRole('listitem').filter({ hasText: `Review today: ${cast.athleteName}` });
  await notice.getByRole('link', { name: 'Read the report' }).click();
  await expectTheWholeReport(priya, cast);

  await priya.getByRole('link', { name: `← ${cast.athleteName}` }).click();
  await expectHome(priya, cast.athleteName);
  await priya
    .getByRole('list', { name: `Pain reports of ${cast.athleteName}` })
    .getByRole('link')
    .click();
  await expectTheWholeReport(priya, cast);

  await priya.getByRole('button', { name: 'Open a case from this report' }).click();
  const form = priya.getByRole('form', { name: `Open a case for ${cast.athleteName}` });
  await expect(form.getByRole('checkbox', { name: 'Lower back', exact: true })).toBeChecked();
  await expect(form.getByLabel('Onset date')).toHaveValue(isoDay(-2));
  await expect(form.getByRole('link', { name: /the pain report of/ })).toHaveAttribute('href', `/pain-reports/${cast.reportId}`);
  await keepScreenshot(priya, testInfo, 'pain-report-open-case');
  await expectNoSidewaysScroll(priya);
  await form.getByLabel('Status', { exact: true }).selectOption('limited');
  await form.getByRole('button', { name: 'Save case' }).click();
  await expect(priya).toHaveURL(/\/clinician\/cases\/[0-9a-f-]{36}$/);
  const caseUrl = new URL(priya.url()).pathname;
  await priya.getByRole('link', { name: /^the pain report of/ }).click();
  await expectTheWholeReport(priya, cast);
  await expect(priya.getByRole('link', { name: 'open the case' })).toHaveAttribute('href', caseUrl);
  await expect(priya.getByRole('button', { name: 'Open a case from this report' })).toHaveCount(0);
  await priya.context().close();

  const theo = await (await browser.newContext(contextOptions(testInfo))).newPage();
  await signIn(theo, DEMO.coachTheo.email);
  await theo.goto(`/pain-reports/${cast.reportId}`);
  await expectHome(theo, `Pain report: ${cast.athleteName}`);
  await expect(theo.getByRole('region', { name: 'The pain' })).toContainText('5/10');
  await expect(theo.getByRole('region', { name: 'Warning-sign answers' })).toHaveCount(0);
  await expect(theo.getByText(cast.note)).toHaveCount(0);
  await expect(theo.getByText(URGENT.question)).toHaveCount(0);
  await expect(theo.getByText(/for their clinicians only/)).toBeVisible();
  await expect(theo.getByRole('button', { name: 'Open a case from this report' })).toHaveCount(0);
  await keepScreenshot(theo, testInfo, 'pain-report-coach');
  expect(await seriousAxeViolations(theo), 'WCAG 2.1 AA (axe-core) on the coach’s pain-report page').toEqual([]);
  await theo.context().close();
});
