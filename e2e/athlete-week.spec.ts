import { randomUUID } from 'node:crypto';
import { expect, test, type Browser, type BrowserContextOptions, type Page } from '@playwright/test';
import type { SessionDto } from '../policies/dto';
import { pickScore } from './athlete-helpers';
import { DEMO, NEW_PASSWORD, expectHome, expectNoSidewaysScroll, keepScreenshot, signIn } from './helpers';
import { contextOptions, isoDay } from './plan-helpers';
import { apiWrite } from './uploads-helpers';

/**
 * The athlete's week looks ahead and logs from the plan: an athlete of this spec's own
 * (invited fresh with their own coach and clinician, so nothing another spec reads is touched) reads
 * pounds, is Limited with a stage from today to the day after tomorrow (lifting from the floor up to
 * 45 kg, no jumping), and has a published session today and one in four days. In My week they see
 * the coming seven days — the cap as a load they can put on the bar, 95 lb, never 99.2 lb (45 kg =
 * 99.208 lb, NIST SP 811; 5-lb steps, common practice) — log today's session from the plan with one
 * set changed to what was actually lifted, are told it was over a limit, and the coach has the flag.
 * Runs on the desktop and the phone, each with its own people.
 */

interface Person {
  page: Page;
  membershipId: string;
}

async function join(browser: Browser, options: BrowserContextOptions, link: string, name: string): Promise<Person> {
  const page = await (await browser.newContext(options)).newPage();
  const session = await apiWrite<SessionDto>(page.request, 'post', '/invitations/accept', {
    token: link.split('#')[1],
    displayName: name,
    password: NEW_PASSWORD,
  });
  return { page, membershipId: session.memberships[0].id };
}

test('an athlete sees the coming week with limits on the bar, and logs a planned session with an edit', async ({ browser }, testInfo) => {
  test.setTimeout(150_000);
  const stamp = `${testInfo.project.name}-${Date.now().toString(36)}`;
  const options = contextOptions(testInfo);
  const today = isoDay(0);

  const admin = await (await browser.newContext(options)).newPage();
  const people: Page[] = [admin];
  try {
    await signIn(admin, DEMO.admin.email);
    const orgId = ((await (await admin.request.get('/api/session')).json()) as SessionDto).memberships[0].organizationId;
    const invite = async (label: string, roles: string[], extra: Record<string, string> = {}) =>
      (
        await apiWrite<{ link: string }>(admin.request, 'post', `/orgs/${orgId}/invitations`, {
          email: `e2e-week-${label}-${stamp}@harborpoint.example`,
          roles,
          ...extra,
        })
      ).link;
    const athleteName = `Week Athlete ${stamp}`;
    const athlete = await join(browser, options, await invite('athlete', ['athlete'], { dateOfBirth: '2004-05-06' }), athleteName);
    const coach = await join(browser, options, await invite('coach', ['coach']), `Week Coach ${stamp}`);
    const clinician = await join(browser, options, await invite('clinician', ['clinician']), `Week Clinician ${stamp}`);
    people.push(athlete.page, coach.page, clinician.page);
    for (const [member, role] of [
      [coach, 'coach'],
      [clinician, 'clinician'],
    ] as const) {
      await apiWrite(admin.request, 'post', `/orgs/${orgId}/care-team`, {
        athleteId: athlete.membershipId,
        memberId: member.membershipId,
        role,
      });
    }
    await apiWrite(athlete.page.request, 'patch', '/me', { unitPref: 'lb' });

    const opened = await apiWrite<{ id: string }>(clinician.page.request, 'post', `/orgs/${orgId}/cases`, {
      athleteId: athlete.membershipId,
      bodyRegions: ['lower_back'],
      onsetDate: today,
      status: 'limited',
      statusEffectiveFrom: today,
    });
    await apiWrite(clinician.page.request, 'post', `/orgs/${orgId}/cases/${opened.id}/plan`, {
      guidance: '',
      stages: [
        {
          id: randomUUID(),
          startDate: today,
          endDate: isoDay(2),
          painCeiling: 4,
          patterns: { hinge: { mode: 'capped', caps: { maxLoadKg: 45 } }, jump: { mode: 'blocked' } },
        },
      ],
    });

    const library = (await (await coach.page.request.get(`/api/orgs/${orgId}/exercises`)).json()) as { id: string; name: string }[];
    const deadlift = library.find((e) => e.name === 'Deadlift')!.id;
    const program = await apiWrite<{ id: string }>(coach.page.request, 'post', `/orgs/${orgId}/programs`, {
      name: `Return block ${stamp}`,
      athleteIds: [athlete.membershipId],
    });
    const publishSession = async (date: string, title: string) => {
      const sets = [1, 2, 3].map(() => ({ id: randomUUID(), reps: 5, load: { kind: 'kg', value: 40 }, targetRpe: 6 }));
      const s = await apiWrite<{ id: string; version: number }>(
        coach.page.request,
        'post',
        `/orgs/${orgId}/programs/${program.id}/sessions`,
        {
          date,
          title,
          content: { exercises: [{ id: randomUUID(), exerciseId: deadlift, sets }] },
        },
      );
      await apiWrite(coach.page.request, 'post', `/orgs/${orgId}/sessions/${s.id}/publish`, { version: s.version });
    };
    await publishSession(today, 'Floor lifts');
    await publishSession(isoDay(4), 'After the stage');

    // My week: seven days from the organization's today.
    const me = athlete.page;
    await me.goto('/athlete');
    // Today's limits on the home page are a load on the bar too.
    await expect(me.getByText('Hinge: up to 95 lb', { exact: true })).toBeVisible();
    await me.getByRole('link', { name: 'My week' }).click();
    await expectHome(me, 'My week');
    const week = me.getByRole('region', { name: 'The coming week' });
    // One card per day, each named by its date (the limits and sets inside are lists of their own).
    const days = week.locator('li[aria-label]');
    await expect(days).toHaveCount(7);
    const todayCard = week.getByRole('listitem', { name: /^Today, / });
    await expect(todayCard).toContainText('lifting from the floor and bending at the hips (hinge): up to 95 lb');
    await expect(todayCard).toContainText('jumping and landing (jump / landing)');
    await expect(todayCard).toContainText('Stop and tell your clinician if pain goes past 4/10.');
    // 40 kg = 88.18 lb (NIST SP 811): on the bar, rounded down to a 5 lb step (common practice), 85 lb.
    await expect(todayCard).toContainText('3 sets of 5 reps at 85 lb · RPE 6');
    await expect(week).not.toContainText('88.18');
    await expect(week).not.toContainText('99.2');
    // The day after tomorrow is the stage's last day; the day after it has no limits and nothing planned.
    const dayThree = days.nth(3);
    await expect(dayThree).toContainText('No movement limits, but follow what your clinician told you.');
    await expect(dayThree).toContainText('Nothing planned.');
    await expect(days.nth(4)).toContainText('After the stage');
    await expect(week.getByRole('link', { name: 'Log this session: After the stage' })).toHaveCount(0);
    await expectNoSidewaysScroll(me);
    await keepScreenshot(me, testInfo, 'athlete-coming-week');

    // Log this session: the planned sets are filled in; the athlete changes one to what was lifted and removes one.
    await todayCard.getByRole('link', { name: 'Log this session: Floor lifts' }).click();
    await expectHome(me, 'Log a session');
    await expect(me.getByText('From your plan: Floor lifts')).toBeVisible();
    const setRow = (n: number) => me.getByRole('group', { name: `Set ${n}`, exact: true });
    await expect(setRow(1).getByLabel('Exercise')).toHaveValue('Deadlift');
    await expect(setRow(1).getByLabel('Load')).toHaveValue('85');
    await expect(setRow(1).getByLabel('Reps')).toHaveValue('5');
    await expect(setRow(3).getByLabel('Load')).toHaveValue('85');
    await setRow(2).getByLabel('Load').fill('225');
    await setRow(2).getByLabel('Reps').fill('3');
    await me.getByRole('button', { name: 'Remove set 3' }).click();
    await expect(setRow(3)).toHaveCount(0);
    await me.getByLabel('Duration (minutes)').fill('40');
    await me.getByLabel('Session effort (0–10)').fill('6');
    await pickScore(me, 'Pain before', 1);
    await pickScore(me, 'Pain during', 2);
    await expectNoSidewaysScroll(me);
    await me.getByRole('button', { name: 'Save session' }).click();
    await expect(me.getByRole('heading', { name: 'Session saved' })).toBeFocused();
    // 225 lb = 102.06 kg, over the 45 kg cap: recorded as done, and said in the athlete's unit (45 kg → 95 lb on the bar).
    const over = me.getByText('Some sets were over your limits for that day');
    await expect(over).toBeVisible();
    await expect(
      me.getByText(
        /^Deadlift 225 lb × 3 was more than your limit for lifting from the floor and bending at the hips \(hinge\) on .*: up to 95 lb\.$/,
      ),
    ).toBeVisible();
    await keepScreenshot(me, testInfo, 'athlete-logged-over-limit');

    await me.getByRole('link', { name: 'My week', exact: true }).click();
    await expectHome(me, 'My week');
    await expect(me.getByRole('listitem', { name: /^Today, / })).toContainText('Logged.');

    // The coach (and the clinician) have the flag, saying what is over which limit.
    for (const staff of [coach, clinician]) {
      const flags = (await (await staff.page.request.get(`/api/orgs/${orgId}/flags?athleteId=${athlete.membershipId}`)).json()) as {
        kind: string;
        message: string;
      }[];
      const flag = flags.find((f) => f.kind === 'over_limit');
      expect(flag?.message).toContain('Deadlift 102.06 kg × 3 at RPE 6 is over the limit');
    }
  } finally {
    for (const p of people) await p.context().close();
  }
});
