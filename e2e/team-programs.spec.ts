import { randomUUID } from 'node:crypto';
import AxeBuilder from '@axe-core/playwright';
import { expect, test, type APIRequestContext, type Locator, type Page } from '@playwright/test';
import pg from 'pg';
import type { ExerciseDto, SessionDto } from '../policies/dto';
import { DEMO, DEMO_PASSWORD, HOME_HEADING, expectHome, expectNoSidewaysScroll, keepScreenshot, signIn } from './helpers';
import { BROWSER_ZONE, contextOptions, isoDay } from './plan-helpers';
import { apiWrite } from './uploads-helpers';

/**
 * The coach's side of team programming in the browser. The spec owns its people: a coach,
 * a clinician and a squad of eight athletes made by SQL in the demo organization (no other spec reads
 * them), two of them restricted by the clinician — deadlift (hinge) capped at 60 % of 1RM, and sprinting
 * blocked. The coach writes one squad session, reviews the grid (the capped athlete "Fitted", the
 * blocked one "Needs a decision"), is refused a publish that lists who and what, accepts the drop (the
 * grid then says "Drop accepted"), and publishes to the group. The clinician then tightens the hinge cap; the grid says "Needs review" for
 * that athlete until the coach accepts the new fit. Last, the grid at 390 px wide.
 */

test.skip(({ isMobile }) => isMobile, 'staff screens; one flow over its own records (the 390 px check is inside)');
test.use({ timezoneId: BROWSER_ZONE });

const SESSION = 'Squad lift (e2e)';
const PROGRAM = 'Squad strength (e2e)';

interface Cast {
  orgId: string;
  stamp: string;
  coachEmail: string;
  clinicianEmail: string;
  athletes: { id: string; name: string }[];
  groupId: string;
}

/** The people and the group, by SQL, as the groups screens (built separately) and an admin would. */
async function castTeam(): Promise<Cast> {
  const url = process.env.E2E_DATABASE_URL;
  if (!url) throw new Error('E2E_DATABASE_URL is not set: run the browser tests through scripts/test.ts');
  const db = new pg.Client({ connectionString: url });
  await db.connect();
  try {
    const stamp = `${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}`;
    const { rows: orgRows } = await db.query<{ organization_id: string; password_hash: string }>(
      `SELECT m.organization_id, u.password_hash FROM memberships m JOIN users u ON u.id = m.user_id WHERE u.email = $1`,
      [DEMO.admin.email],
    );
    const { organization_id: orgId, password_hash: hash } = orgRows[0];
    const person = async (label: string, name: string, roles: string[]) => {
      const email = `e2e-team-${label}-${stamp}@harborpoint.example`;
      const { rows: u } = await db.query<{ id: string }>(
        `INSERT INTO users (email, display_name, password_hash, unit_pref, version) VALUES ($1, $2, $3, 'kg', 1) RETURNING id`,
        [email, name, hash],
      );
      const { rows: m } = await db.query<{ id: string }>(
        `INSERT INTO memberships (organization_id, user_id, roles, active, version) VALUES ($1, $2, $3::text[], true, 1) RETURNING id`,
        [orgId, u[0].id, roles],
      );
      if (roles.includes('athlete'))
        await db.query(
          `INSERT INTO athlete_profiles (membership_id, organization_id, date_of_birth, sport, version) VALUES ($1, $2, '2001-05-04', 'Rugby', 1)`,
          [m[0].id, orgId],
        );
      return { email, id: m[0].id, name };
    };
    const coach = await person('coach', `Squad Coach ${stamp}`, ['coach']);
    const clinician = await person('clinician', `Squad Clinician ${stamp}`, ['clinician']);
    const athletes: { id: string; name: string }[] = [];
    for (let i = 1; i <= 8; i++) athletes.push(await person(`athlete${i}`, `Squad ${String.fromCharCode(64 + i)} ${stamp}`, ['athlete']));
    for (const a of athletes)
      await db.query(`INSERT INTO care_team_assignments (organization_id, athlete_id, member_id, role) VALUES ($1, $2, $3, 'coach')`, [
        orgId,
        a.id,
        coach.id,
      ]);
    for (const a of athletes.slice(0, 2))
      await db.query(`INSERT INTO care_team_assignments (organization_id, athlete_id, member_id, role) VALUES ($1, $2, $3, 'clinician')`, [
        orgId,
        a.id,
        clinician.id,
      ]);
    // As server/src/test/worlds/team-world.ts: group_members.member_id is a membership id.
    const { rows: g } = await db.query<{ id: string }>(
      `INSERT INTO groups (organization_id, name, kind, version) VALUES ($1, $2, 'team', 1) RETURNING id`,
      [orgId, `Squad ${stamp}`],
    );
    await db.query(
      `INSERT INTO group_members (group_id, member_id, role, organization_id)
       SELECT $1, m, r, $2 FROM unnest($3::uuid[], $4::text[]) AS x(m, r)`,
      [g[0].id, orgId, [coach.id, ...athletes.map((a) => a.id)], ['coach', ...athletes.map(() => 'athlete')]],
    );
    return { orgId, stamp, coachEmail: coach.email, clinicianEmail: clinician.email, athletes, groupId: g[0].id };
  } finally {
    await db.end();
  }
}

async function apiPut<T>(request: APIRequestContext, path: string, data: unknown): Promise<T> {
  const token = ((await (await request.get('/api/session')).json()) as SessionDto).csrfToken;
  const res = await request.put(`/api${path}`, { data, headers: { 'X-CSRF-Token': token } });
  expect(res.ok(), `PUT ${path} → ${res.status()} ${await res.text()}`).toBe(true);
  return (await res.json()) as T;
}

const stagesWith = (patterns: object) => [{ id: randomUUID(), startDate: isoDay(-30), endDate: isoDay(120), painCeiling: 5, patterns }];

/** The team session editor: a section named by its heading, "<title> · <date>". */
const editorOf = (page: Page) => page.getByRole('region', { name: new RegExp(`^${SESSION.replace(/[()]/g, '\\$&')} ·`) });
const gridOf = (page: Page) => page.getByRole('region', { name: 'Review grid, scrolls sideways' });
const cellLink = (page: Page, athlete: string, words: string) =>
  gridOf(page).getByRole('link', { name: new RegExp(`^${athlete}, ${SESSION.replace(/[()]/g, '\\$&')}: ${words}`) });

/** Serious and critical WCAG A/AA findings of axe on the page as it stands (as e2e/accessibility.spec.ts). */
async function seriousAxe(page: Page): Promise<string[]> {
  const { violations } = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
  return violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
}

async function addExercise(editor: Locator, name: string) {
  await editor.getByRole('button', { name: 'Add exercise', exact: true }).click();
  await editor.getByRole('searchbox', { name: 'Find an exercise' }).fill(name);
  await editor.getByRole('list', { name: 'Matching exercises' }).getByRole('button', { name, exact: true }).click();
}

test('a coach writes one squad session, reviews every athlete’s version, publishes to the group, and reviews a limit change', async ({
  page,
  browser,
}, testInfo) => {
  test.setTimeout(180_000);
  const cast = await castTeam();
  const [hinge, sprint] = cast.athletes;
  const { orgId } = cast;

  await signIn(page, cast.coachEmail, DEMO_PASSWORD);
  await expectHome(page, HOME_HEADING.coach);
  const exercises = (await (await page.request.get(`/api/orgs/${orgId}/exercises`)).json()) as ExerciseDto[];
  const deadlift = exercises.find((e) => e.name === 'Deadlift')!;
  // The spec's own sprint, with nothing to use instead: the starter library's "Sprint 20 m" names bike
  // intervals, which a blocked sprint is fitted to, and this story needs a set nothing fits.
  const SPRINT = `Hill sprint ${cast.stamp}`;
  await apiWrite(page.request, 'post', `/orgs/${orgId}/exercises`, {
    name: SPRINT,
    patterns: ['sprint'],
    equipment: 'bodyweight',
    ballistic: true,
    steps: { kind: 'increment', step: 2.5, unit: 'kg' },
  });
  // A tested deadlift of 140 kg for everyone: 75 % is 105 kg; a 60 % cap allows 84 kg (82.5 kg on 2.5 kg steps).
  for (const a of cast.athletes)
    await apiWrite(page.request, 'post', `/orgs/${orgId}/athletes/${a.id}/baselines`, {
      exerciseId: deadlift.id,
      kind: 'tested',
      loadKg: 140,
      reps: 1,
      testedOn: isoDay(0),
    });

  const clinicianContext = await browser.newContext(contextOptions(testInfo));
  const clinician = await clinicianContext.newPage();
  let hingePlan: { id: string; version: number };
  try {
    await signIn(clinician, cast.clinicianEmail, DEMO_PASSWORD);
    const plans: { id: string; version: number }[] = [];
    for (const [athlete, patterns] of [
      [hinge, { hinge: { mode: 'capped', caps: { maxPercent1RM: 60 } } }],
      [sprint, { sprint: { mode: 'blocked' } }],
    ] as const) {
      const opened = await apiWrite<{ id: string }>(clinician.request, 'post', `/orgs/${orgId}/cases`, {
        athleteId: athlete.id,
        bodyRegions: ['lower_back'],
        onsetDate: isoDay(-30),
        status: 'limited',
        statusEffectiveFrom: isoDay(-30),
      });
      plans.push(
        await apiWrite<{ id: string; version: number }>(clinician.request, 'post', `/orgs/${orgId}/cases/${opened.id}/plan`, {
          stages: stagesWith(patterns),
          guidance: '',
        }),
      );
    }
    hingePlan = plans[0];

    // The team program itself is started by the groups screens (built separately): here through the API.
    await apiWrite(page.request, 'post', `/orgs/${orgId}/team-programs`, { groupId: cast.groupId, name: PROGRAM });

    // The coach home lists it; the coach opens it and writes the squad session in the browser.
    await page.goto('/coach');
    const teamPrograms = page.getByRole('region', { name: 'Team programs' });
    await teamPrograms.getByRole('link', { name: PROGRAM }).click();
    await expectHome(page, PROGRAM);
    const add = page.getByRole('form', { name: 'Add a team session' });
    await add.getByLabel('Session date').fill(isoDay(3));
    await add.getByLabel('Session title').fill(SESSION);
    await add.getByRole('button', { name: 'Add team session' }).click();
    const editor = editorOf(page);
    await expect(editor).toBeVisible();

    await addExercise(editor, 'Deadlift');
    const set1 = editor.getByRole('group', { name: 'Set 1 of Deadlift', exact: true });
    await set1.getByLabel('Reps', { exact: true }).fill('5');
    await set1.getByLabel('Load unit').selectOption('percent');
    await set1.getByLabel('Load', { exact: true }).fill('75');
    await editor.getByRole('button', { name: 'Add a set to Deadlift' }).click();
    await editor.getByRole('button', { name: 'Add a set to Deadlift' }).click();
    await addExercise(editor, SPRINT);
    const sprintSet = editor.getByRole('group', { name: `Set 1 of ${SPRINT}`, exact: true });
    await sprintSet.getByLabel('Load unit').selectOption('bodyweight');
    await sprintSet.getByLabel('Reps', { exact: true }).fill('4');
    await editor.getByRole('button', { name: 'Save the team session' }).click();
    await expect(editorOf(page).getByText('Saved', { exact: true })).toBeVisible();

    // The review grid: as written for the unrestricted, fitted for the hinge cap, a decision for the blocked sprint.
    await expect(cellLink(page, hinge.name, 'Fitted \\(3 changes\\)$')).toBeVisible();
    await expect(cellLink(page, sprint.name, 'Needs a decision$')).toBeVisible();
    for (const a of cast.athletes.slice(2)) await expect(cellLink(page, a.name, 'As written$')).toBeVisible();
    await keepScreenshot(page, testInfo, 'team-grid');
    expect(await seriousAxe(page), 'axe on the team program screen').toEqual([]);

    // Publishing is all or nothing: the refusal lists who, which session and what.
    await page.getByRole('button', { name: `Publish ${SESSION} to the group` }).click();
    const refusal = page.getByRole('alert').filter({ hasText: 'Nothing was published' });
    await expect(refusal).toBeVisible();
    const problems = refusal.getByRole('list', { name: 'Problems to resolve before publishing' });
    await expect(problems.getByRole('listitem').filter({ hasText: sprint.name }).first()).toContainText(SESSION);
    await expect(problems).toContainText('could not be made to fit and was dropped');
    await expect(problems).not.toContainText(hinge.name);

    // The coach opens the blocked athlete's version, reads why, and accepts the drop.
    await problems.getByRole('link', { name: sprint.name }).click();
    await expectHome(page, `${sprint.name} — ${SESSION}`);
    const lines = page.getByRole('region', { name: 'Line by line' });
    await expect(lines.getByRole('row').filter({ hasText: SPRINT })).toContainText('Left out');
    expect(await seriousAxe(page), 'axe on the athlete version screen').toEqual([]);
    await page.getByRole('button', { name: 'Accept the drop' }).click();
    await expect(page.getByRole('status').filter({ hasText: 'Drop accepted' })).toBeVisible();
    await expect(page.getByRole('button', { name: 'Accept the drop' })).toHaveCount(0);
    await page.getByRole('link', { name: '← The team program' }).click();
    await expectHome(page, PROGRAM);
    // The grid keeps the decision: the cell no longer asks for one, and says the drop was accepted.
    const accepted = cellLink(page, sprint.name, 'Fitted, part left out · Drop accepted$');
    await expect(accepted).toBeVisible();
    await expect(accepted).toContainText('Drop accepted');
    // Opened again, the version screen still says so (read from the version, not from the click).
    await accepted.click();
    await expectHome(page, `${sprint.name} — ${SESSION}`);
    await expect(page.getByRole('status').filter({ hasText: 'Drop accepted' })).toBeVisible();
    await expect(page.getByRole('button', { name: 'Accept the drop' })).toHaveCount(0);
    await page.getByRole('link', { name: '← The team program' }).click();
    await expectHome(page, PROGRAM);

    await page.getByRole('button', { name: `Publish ${SESSION} to the group` }).click();
    await expect(page.getByRole('status').filter({ hasText: 'Published to the group' })).toContainText('8 athlete versions published.');
    await expect(cellLink(page, hinge.name, 'Fitted \\(3 changes\\) · Published$')).toBeVisible();
    await expect(cellLink(page, sprint.name, 'Fitted, part left out · Drop accepted · Published$')).toBeVisible();

    // The clinician tightens the hinge cap to 50 %: the coach's grid asks for a review of that athlete.
    const current = (await (await clinician.request.get(`/api/orgs/${orgId}/plans/${hingePlan.id}`)).json()) as { version: number };
    await apiPut(clinician.request, `/orgs/${orgId}/plans/${hingePlan.id}`, {
      stages: stagesWith({ hinge: { mode: 'capped', caps: { maxPercent1RM: 50 } } }),
      guidance: '',
      version: current.version,
    });
  } finally {
    await clinicianContext.close();
  }

  await page.reload();
  const review = cellLink(page, hinge.name, 'Fitted \\(3 changes\\)');
  await expect(review).toHaveAccessibleName(/Needs review/);
  await expect(review).toContainText('Needs review');
  await review.click();
  await expect(page.getByText('A new fit after a limit change')).toBeVisible();
  await page.getByRole('button', { name: 'Accept the new fit' }).click();
  await expect(page.getByRole('status').filter({ hasText: 'Reviewed' })).toContainText('You accepted this fit');
  await expect(page.getByText('A new fit after a limit change')).toHaveCount(0);
  await expect(page.getByLabel('State of this version')).not.toContainText('Needs review');
  await page.getByRole('link', { name: '← The team program' }).click();
  await expect(cellLink(page, hinge.name, 'Fitted \\(3 changes\\) · Reviewed · Published$')).toBeVisible();

  // Two more (empty) team sessions, so the grid is wider than a phone.
  const programId = new URL(page.url()).pathname.split('/')[3];
  for (const [day, title] of [
    [5, 'Squad speed (e2e)'],
    [7, 'Squad lift B (e2e)'],
  ] as const)
    await apiWrite(page.request, 'post', `/orgs/${orgId}/team-programs/${programId}/sessions`, {
      date: isoDay(day),
      title,
      content: { exercises: [] },
    });

  // At 390 px the grid scrolls inside its own box, the athlete column stays put, and the page itself does not scroll sideways.
  const phoneContext = await browser.newContext(
    contextOptions(testInfo, { viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true, userAgent: undefined }),
  );
  try {
    const phone = await phoneContext.newPage();
    await signIn(phone, cast.coachEmail, DEMO_PASSWORD);
    await phone.goto(`/coach/team-programs/${programId}`);
    await expectHome(phone, PROGRAM);
    const grid = gridOf(phone);
    await grid.scrollIntoViewIfNeeded();
    await expect(cellLink(phone, sprint.name, 'Fitted, part left out')).toBeVisible();
    await expectNoSidewaysScroll(phone);
    await keepScreenshot(phone, testInfo, 'team-program-390');
    // Three sessions of at least 10rem beside the 8rem athlete column are wider than the phone: the grid's
    // own box must overflow (if it did not, the scroll below would prove nothing and fail for that reason).
    const overflow = await grid.evaluate((el) => ({ scroll: el.scrollWidth, client: el.clientWidth }));
    expect(overflow.scroll, 'the review grid is wider than its box at 390 px').toBeGreaterThan(overflow.client);
    const athleteCell = grid.getByRole('rowheader', { name: new RegExp(hinge.name) });
    const before = await athleteCell.boundingBox();
    await grid.evaluate((el) => el.scrollBy({ left: 400 }));
    await expect.poll(() => grid.evaluate((el) => el.scrollLeft)).toBeGreaterThan(0);
    const after = await athleteCell.boundingBox();
    expect(after?.x).toBe(before?.x);
    const cell = cellLink(phone, hinge.name, 'Fitted');
    const box = await cell.boundingBox();
    // A cell is a comfortable tap target and fully on screen once scrolled to.
    expect(box!.height).toBeGreaterThanOrEqual(24);
    await keepScreenshot(phone, testInfo, 'team-grid-390');

    // The version screen at 390 px: the line-by-line table scrolls in its own box, the page does not.
    await grid.evaluate((el) => el.scrollTo({ left: 0 }));
    await cellLink(phone, sprint.name, 'Fitted, part left out').click();
    await expectHome(phone, `${sprint.name} — ${SESSION}`);
    await expect(phone.getByRole('status').filter({ hasText: 'Drop accepted' })).toBeVisible();
    await expectNoSidewaysScroll(phone);
    await keepScreenshot(phone, testInfo, 'team-version-390');
  } finally {
    await phoneContext.close();
  }
});
