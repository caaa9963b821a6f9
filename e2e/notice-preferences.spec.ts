import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Browser, type BrowserContextOptions, type Page } from '@playwright/test';
import { randomUUID } from 'node:crypto';
import type { SessionDto } from '../policies/dto';
import { jargonIn } from '../policies/plain-words';
import { DEMO, expectHome, expectNoSidewaysScroll, keepScreenshot, NEW_PASSWORD, signIn } from './helpers';
import { BROWSER_ZONE, contextOptions, isoDay } from './plan-helpers';
import { apiWrite } from './uploads-helpers';

/**
 * Everyone hears every change, in the browser, with people of its own (nothing another spec reads is
 * touched): Dana (the demo admin) invites a 16-year-old athlete, a clinician and the athlete's guardian; the
 * clinician writes a plan through the API. The guardian, on a phone, reads it in plain words on the Notices
 * page — no "hinge", no "RPE" — and switches the e-mail copy of plan changes off there; the emergency kind
 * shows as fixed. The athlete reads the same plan addressed to them.
 */

test.skip(({ isMobile }) => isMobile, 'one flow over its own records; the guardian’s and the athlete’s phones open inside it');
test.use({ timezoneId: BROWSER_ZONE });

interface Person {
  page: Page;
  name: string;
  membershipId: string;
}

async function join(browser: Browser, options: BrowserContextOptions, link: string, name: string): Promise<Person> {
  const page = await (await browser.newContext(options)).newPage();
  const session = await apiWrite<SessionDto>(page.request, 'post', '/invitations/accept', {
    token: link.split('#')[1],
    displayName: name,
    password: NEW_PASSWORD,
  });
  return { page, name, membershipId: session.memberships[0].id };
}

test.describe.serial('notices in their own words, and e-mail per kind', () => {
  let admin: Page;
  let athlete: Person;
  let clinician: Person;
  let guardian: Person;

  test.beforeAll(async ({ browser }, testInfo) => {
    // The file-level skip skips the tests, not this setup: do not make people the phone project never uses.
    test.skip(!!testInfo.project.use.isMobile, 'desktop project only');
    test.setTimeout(90_000);
    const stamp = `${Date.now().toString(36)}${Math.random().toString(36).slice(2, 5)}`;
    const desktop = contextOptions(testInfo);
    const phone = contextOptions(testInfo, { viewport: { width: 375, height: 740 }, isMobile: true, hasTouch: true, userAgent: undefined });
    admin = await (await browser.newContext(desktop)).newPage();
    await signIn(admin, DEMO.admin.email);
    const orgId = ((await (await admin.request.get('/api/session')).json()) as SessionDto).memberships[0].organizationId;
    const invite = async (label: string, roles: string[], extra: Record<string, string> = {}) =>
      (
        await apiWrite<{ link: string }>(admin.request, 'post', `/orgs/${orgId}/invitations`, {
          email: `e2e-notices-${label}-${stamp}@harborpoint.example`,
          roles,
          ...extra,
        })
      ).link;
    // Born sixteen years before today: a minor, whose guardian is told.
    const born = `${Number(isoDay(0).slice(0, 4)) - 16}-01-15`;
    athlete = await join(browser, phone, await invite('athlete', ['athlete'], { dateOfBirth: born }), `Notice Athlete ${stamp}`);
    clinician = await join(browser, desktop, await invite('clinician', ['clinician']), `Notice Clinician ${stamp}`);
    guardian = await join(browser, phone, await invite('guardian', ['guardian']), `Notice Guardian ${stamp}`);
    await apiWrite(admin.request, 'post', `/orgs/${orgId}/guardian-links`, {
      athleteId: athlete.membershipId,
      guardianId: guardian.membershipId,
    });
    await apiWrite(admin.request, 'post', `/orgs/${orgId}/care-team`, {
      athleteId: athlete.membershipId,
      memberId: clinician.membershipId,
      role: 'clinician',
    });
    const opened = await apiWrite<{ id: string }>(clinician.page.request, 'post', `/orgs/${orgId}/cases`, {
      athleteId: athlete.membershipId,
      bodyRegions: ['lower_back'],
      onsetDate: isoDay(-2),
      status: 'limited',
      statusEffectiveFrom: isoDay(0),
    });
    await apiWrite(clinician.page.request, 'post', `/orgs/${orgId}/cases/${opened.id}/plan`, {
      guidance: 'Walk every day.',
      stages: [
        {
          id: randomUUID(),
          startDate: isoDay(0),
          endDate: isoDay(20),
          painCeiling: 3,
          patterns: { hinge: { mode: 'blocked' }, squat: { mode: 'capped', caps: { maxRpe: 6 } }, rotation: { mode: 'blocked' } },
        },
      ],
    });
  });

  test.afterAll(async () => {
    for (const page of [admin, athlete?.page, clinician?.page, guardian?.page]) await page?.context().close();
  });

  test('the guardian reads the new plan on the phone in plain words: no hinge, no RPE, no rotation', async () => {
    const page = guardian.page;
    await page.goto('/notices');
    await expectHome(page, 'Notices');
    const notice = page
      .getByRole('listitem')
      .filter({ has: page.getByRole('heading', { name: `${athlete.name}'s training limits have been set` }) });
    await expect(notice).toContainText('No lifting heavy things from the floor or bending forward with weight.');
    await expect(notice).toContainText('keep it at a comfortable effort, able to do 4 more');
    await expect(notice).toContainText('No twisting the body under effort');
    expect(jargonIn(await notice.innerText())).toEqual([]);
    const status = page
      .getByRole('listitem')
      .filter({ has: page.getByRole('heading', { name: new RegExp(`^${athlete.name}'s training status: Limited`) }) });
    await expect(status).toContainText('training again, with some limits');
    await expectNoSidewaysScroll(page);
  });

  test('the athlete reads the same plan addressed to them', async () => {
    const page = athlete.page;
    await page.goto('/notices');
    const notice = page.getByRole('listitem').filter({ has: page.getByRole('heading', { name: 'Your training limits have been set' }) });
    await expect(notice).toContainText('Your clinician set out what you may do in training.');
    await expect(notice).toContainText("Your clinician's advice: Walk every day.");
    expect(jargonIn(await notice.innerText())).toEqual([]);
  });

  test('the guardian switches plan e-mails off; the choice stays after a reload; the emergency e-mail is fixed on', async () => {
    const page = guardian.page;
    await page.goto('/notices');
    const section = page.getByRole('region', { name: 'E-mail me about' });
    const plans = section.getByRole('checkbox', { name: 'A new version of the limits (restriction plan)' });
    await expect(plans).toBeChecked();
    await plans.uncheck();
    await expect(section.getByRole('status')).toContainText('Your e-mail choices are saved.');
    await page.reload();
    await expect(
      page
        .getByRole('region', { name: 'E-mail me about' })
        .getByRole('checkbox', { name: 'A new version of the limits (restriction plan)' }),
    ).not.toBeChecked();
    const emergency = page.getByRole('checkbox', { name: /Your athlete was told to get urgent medical care/ });
    await expect(emergency).toBeChecked();
    await expect(emergency).toBeDisabled();
    await expect(page.getByText('Emergency: always e-mailed, so it cannot be switched off.')).toBeVisible();
    await expect(
      page
        .getByRole('region', { name: 'E-mail me about' })
        .getByRole('checkbox', { name: 'A change of training status (Out, Limited, Full)' }),
    ).toBeChecked();
    // WCAG 2.1 AA (axe-core): the switches, the fixed emergency one and its words, on a 375 px phone.
    const { violations } = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
    expect(violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => `${v.id}: ${v.help}`)).toEqual([]);
    await expectNoSidewaysScroll(page);
    await keepScreenshot(page, test.info(), 'guardian-notices-email-choices');
  });
});
