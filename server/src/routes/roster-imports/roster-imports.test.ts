import { beforeAll, describe, expect, it } from 'vitest';
import pino from 'pino';
import type { RosterPreviewDto } from '../../../../policies/dto';
import { ROSTER_COLUMNS } from '../../../../policies/roster';
import { rosterCsv, upload, waitDone } from '../../test/worlds/roster-imports-fixtures';
import { Client, signedIn, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD, type TestOrg } from '../../test/factories';
import { runRosterImport } from '../../services/roster-import-job';
import { createStorage } from '../../storage';

/**
 * Bringing the roster from a CSV: the template, the preview that writes no people, the background
 * import through the queue (pg-boss) with its invitations, the second import of the same file that
 * changes nothing, and an imported person accepting their invitation.
 */
const h = useHarness({ SIGNIN_MAX_PER_IP: '1000', INVITATIONS_MAX_PER_IP: '1000' }, { mail: true });

describe('roster import', () => {
  let org: TestOrg;
  let orgB: TestOrg;
  let admin: Client;
  let adminB: Client;
  let coach: Client;
  const tag = Math.random().toString(36).slice(2, 8);
  const e = (local: string) => `${local}-${tag}@roster.example`;

  beforeAll(async () => {
    // This file's worker for the roster queue, as server.ts registers it.
    const deps = { ds: h.ds, config: h.config, logger: pino({ level: 'silent' }), jobs: h.jobs!, storage: createStorage(h.config) };
    await h.jobs!.workRosterImports((job) => runRosterImport(deps, job.importId));
    org = await createOrg(h.ds);
    orgB = await createOrg(h.ds);
    admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    adminB = await signedIn(h.app, orgB.admin.email, TEST_PASSWORD);
    coach = await signedIn(h.app, org.coach.email, TEST_PASSWORD);
  });

  const file = () =>
    rosterCsv([
      { name: 'Ada Adult', email: e('ada'), date_of_birth: '2000-05-01', sport: 'Rowing', groups: 'Eights', coach_emails: org.coach.email },
      {
        name: 'Kim Minor',
        email: e('kim'),
        date_of_birth: '2012-01-01',
        groups: 'Eights; Juniors',
        guardian1_name: 'Pat Parent',
        guardian1_email: e('pat'),
        clinician_emails: org.clinician.email,
      },
      { name: 'Lee Minor', email: e('lee'), date_of_birth: '2013-01-01', guardian1_name: 'Pat Parent', guardian1_email: e('pat') },
      { name: 'No Guardian', email: e('nog'), date_of_birth: '2014-01-01' },
      { name: 'Bad Mail', email: 'not-an-address' },
      { name: 'Unknown Coach', email: e('unk'), coach_emails: e('nobody') },
      { name: 'Ada Again', email: e('ada').toUpperCase() },
      { name: 'Old Hand', email: org.otherAthlete.email, coach_emails: org.otherCoach.email },
    ]);

  const count = async (sql: string, params: unknown[]) => Number((await h.ds.query(sql, params))[0].n);
  const members = () => count(`SELECT count(*) AS n FROM memberships WHERE organization_id = $1`, [org.id]);
  const invitations = () => count(`SELECT count(*) AS n FROM invitations WHERE organization_id = $1`, [org.id]);

  it('the template lists the columns an upload takes', async () => {
    const res = await admin.get(`/api/orgs/${org.id}/roster-imports/template.csv`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.text.split('\r\n')[0]).toBe(ROSTER_COLUMNS.join(','));
  });

  let previewId = '';
  it('the preview names each row’s problems and what importing would do, and writes no people', async () => {
    const before = { members: await members(), invitations: await invitations() };
    const res = await upload(admin, org.id, file());
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const body = res.body as RosterPreviewDto;
    previewId = body.import.id;
    expect(body.import).toMatchObject({ status: 'previewed', fileName: 'roster.csv', totalRows: 8, processed: 0 });
    expect(body.counts).toEqual({ rows: 8, create: 3, update: 1, unchanged: 0, skip: 4 });
    const byLine = new Map(body.rows.map((r) => [r.line, r]));
    expect(byLine.get(2)).toMatchObject({ outcome: 'create', problems: [] });
    expect(byLine.get(2)!.does).toContain('starts group Eights');
    expect(byLine.get(3)!.does).toContain('adds guardian Pat Parent and sends an invitation');
    expect(byLine.get(4)!.does).toContain(`links guardian ${e('pat')}`);
    expect(byLine.get(5)!.problems).toEqual([
      { field: 'guardian1_email', message: expect.stringMatching(/^is required: the athlete is under 18 on /) },
    ]);
    expect(byLine.get(6)!.problems).toEqual([{ field: 'email', message: 'must be a valid e-mail address' }]);
    expect(byLine.get(7)!.problems).toEqual([{ field: 'coach_emails', message: `${e('nobody')} is not a coach in this organization` }]);
    expect(byLine.get(8)!.problems).toEqual([{ field: 'email', message: 'is already on line 2 of this file' }]);
    expect(byLine.get(9)).toMatchObject({ outcome: 'update', does: [`puts ${org.otherCoach.email} on the care team as coach`] });
    expect({ members: await members(), invitations: await invitations() }).toEqual(before);
    const audit = await h.ds.query(`SELECT action FROM audit_entries WHERE subject_id = $1`, [previewId]);
    expect(audit).toEqual([{ action: 'roster.previewed' }]);
  });

  it('the import runs in the background through the queue and creates people, links, groups and invitations', async () => {
    const before = { members: await members(), invitations: await invitations() };
    const res = await admin.post(`/api/orgs/${org.id}/roster-imports/${previewId}/start`);
    expect(res.status, JSON.stringify(res.body)).toBe(202);
    expect(res.body.status).toBe('queued');
    const done = await waitDone(admin, org.id, previewId);
    expect(done).toMatchObject({ status: 'done', processed: 8, created: 3, updated: 1, unchanged: 0, skipped: 4, invitations: 4 });
    // Ada, Kim, Lee and Pat (once, for two children) are new members; each is invited once.
    expect(await members()).toBe(before.members + 4);
    expect(await invitations()).toBe(before.invitations + 4);
    const kim: { id: string; roles: string[]; dob: string }[] = await h.ds.query(
      `SELECT m.id, m.roles, p.date_of_birth AS dob FROM memberships m JOIN users u ON u.id = m.user_id
         JOIN athlete_profiles p ON p.membership_id = m.id WHERE u.email = $1 AND m.organization_id = $2`,
      [e('kim'), org.id],
    );
    expect(kim).toEqual([{ id: expect.any(String), roles: ['athlete'], dob: '2012-01-01' }]);
    expect(await count(`SELECT count(*) AS n FROM guardian_links WHERE athlete_id = $1`, [kim[0].id])).toBe(1);
    expect(await count(`SELECT count(*) AS n FROM care_team_assignments WHERE athlete_id = $1 AND role = 'clinician'`, [kim[0].id])).toBe(
      1,
    );
    const groups: { name: string; n: string }[] = await h.ds.query(
      `SELECT g.name, count(gm.*) AS n FROM groups g JOIN group_members gm ON gm.group_id = g.id WHERE g.organization_id = $1 GROUP BY g.name ORDER BY g.name`,
      [org.id],
    );
    expect(groups).toEqual([
      { name: 'Eights', n: '2' },
      { name: 'Juniors', n: '1' },
    ]);
    expect(
      await count(`SELECT count(*) AS n FROM care_team_assignments WHERE athlete_id = $1 AND member_id = $2`, [
        org.otherAthlete.membershipId,
        org.otherCoach.membershipId,
      ]),
    ).toBe(1);
    const actions: { action: string; n: string }[] = await h.ds.query(
      `SELECT action, count(*) AS n FROM audit_entries WHERE organization_id = $1 AND action LIKE 'roster.%' GROUP BY action ORDER BY action`,
      [org.id],
    );
    expect(actions).toEqual([
      { action: 'roster.import_started', n: '1' },
      { action: 'roster.imported', n: '1' },
      { action: 'roster.previewed', n: '1' },
      { action: 'roster.row_imported', n: '4' },
    ]);
    // The invitations' e-mails went through the queue to the (fake) mail server.
    expect(await count(`SELECT count(*) AS n FROM email_deliveries WHERE organization_id = $1 AND kind = 'invitation'`, [org.id])).toBe(4);
  });

  it('an import that is done cannot be started again (409)', async () => {
    const res = await admin.post(`/api/orgs/${org.id}/roster-imports/${previewId}/start`);
    expect(res.status).toBe(409);
  });

  it('importing the same file again changes nothing', async () => {
    const before = {
      members: await members(),
      invitations: await invitations(),
      links: await count(`SELECT count(*) AS n FROM guardian_links WHERE organization_id = $1`, [org.id]),
      care: await count(`SELECT count(*) AS n FROM care_team_assignments WHERE organization_id = $1`, [org.id]),
      groups: await count(`SELECT count(*) AS n FROM group_members WHERE organization_id = $1`, [org.id]),
    };
    const res = await upload(admin, org.id, file());
    expect(res.status).toBe(201);
    expect(res.body.counts).toEqual({ rows: 8, create: 0, update: 0, unchanged: 4, skip: 4 });
    expect((await admin.post(`/api/orgs/${org.id}/roster-imports/${res.body.import.id}/start`)).status).toBe(202);
    const done = await waitDone(admin, org.id, res.body.import.id);
    expect(done).toMatchObject({ status: 'done', created: 0, updated: 0, unchanged: 4, invitations: 0 });
    expect({
      members: await members(),
      invitations: await invitations(),
      links: await count(`SELECT count(*) AS n FROM guardian_links WHERE organization_id = $1`, [org.id]),
      care: await count(`SELECT count(*) AS n FROM care_team_assignments WHERE organization_id = $1`, [org.id]),
      groups: await count(`SELECT count(*) AS n FROM group_members WHERE organization_id = $1`, [org.id]),
    }).toEqual(before);
  });

  it('an imported person cannot sign in before accepting; accepting the invitation sets their password', async () => {
    const anon = await Client.anonymous(h.app);
    expect((await anon.signIn(e('ada'), TEST_PASSWORD)).status).toBe(401);
    // The token is only in the e-mail: read it from the fake mailbox.
    let body = '';
    for (let i = 0; i < 100 && !body; i++) {
      const rows: { text_body: string }[] = await h.ds.query(`SELECT text_body FROM fake_mailbox WHERE envelope_to && $1`, [[e('ada')]]);
      body = rows[0]?.text_body ?? '';
      if (!body) await new Promise((r) => setTimeout(r, 200));
    }
    const token = /invite#([A-Za-z0-9_-]{43})/.exec(body)?.[1];
    expect(token).toBeTruthy();
    const accepted = await anon.post('/api/invitations/accept', { token, displayName: 'Ada A. Adult', password: 'a brand new passphrase' });
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(200);
    const again = await Client.anonymous(h.app);
    expect((await again.signIn(e('ada'), 'a brand new passphrase')).status).toBe(200);
  });

  it('only admins import; another organization sees nothing; bad files are refused with the reason', async () => {
    expect((await upload(coach, org.id, file())).status).toBe(403);
    expect((await coach.get(`/api/orgs/${org.id}/roster-imports/${previewId}`)).status).toBe(403);
    expect((await adminB.get(`/api/orgs/${org.id}/roster-imports/${previewId}`)).status).toBe(404);
    expect((await adminB.get(`/api/orgs/${orgB.id}/roster-imports/${previewId}`)).status).toBe(404);
    const headerless = await upload(admin, org.id, 'first,second\r\n1,2');
    expect(headerless.status).toBe(400);
    expect(headerless.body.error.message).toMatch(/Unknown columns: first, second/);
    const binary = await upload(admin, org.id, Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x00, 0xff, 0xfe]));
    expect(binary.status).toBe(400);
    expect(binary.body.error.fields.file).toEqual(['must be a CSV file in UTF-8']);
    const unclosed = await upload(admin, org.id, 'name,email\r\n"Ada,ada@x.example');
    expect(unclosed.status).toBe(400);
    const big = await upload(admin, org.id, Buffer.alloc(2 * 1024 * 1024 + 10, 'a'));
    expect(big.status).toBe(413);
  });

  it('keeps the last checked file for its admin until it is imported: a reload shows it again, a new check replaces it', async () => {
    const lastCheck = (c: Client, orgId = org.id) => c.get(`/api/orgs/${orgId}/roster-imports/last-check`);
    const one = rosterCsv([{ name: 'Rae Reload', email: e('rae') }]);
    const first = await upload(admin, org.id, one);
    expect(first.status).toBe(201);
    const shown = await lastCheck(admin);
    expect(shown.status).toBe(200);
    expect(shown.body.preview).toEqual(first.body);

    const two = await upload(
      admin,
      org.id,
      rosterCsv([
        { name: 'Rae Reload', email: e('rae') },
        { name: 'Sol Second', email: e('sol') },
      ]),
    );
    expect((await lastCheck(admin)).body.preview).toMatchObject({ import: { id: two.body.import.id }, counts: { rows: 2, create: 2 } });
    expect((await admin.get(`/api/orgs/${org.id}/roster-imports/${first.body.import.id}`)).status).toBe(404);
    const [entry] = await h.ds.query(`SELECT after FROM audit_entries WHERE action = 'roster.previewed' AND subject_id = $1`, [
      two.body.import.id,
    ]);
    expect(entry.after.replaces).toEqual([first.body.import.id]);

    // Only admins, and only their own organization's.
    expect((await lastCheck(coach)).status).toBe(403);
    expect((await lastCheck(adminB)).status).toBe(404);
    expect((await lastCheck(adminB, orgB.id)).body).toEqual({ preview: null });

    expect((await admin.post(`/api/orgs/${org.id}/roster-imports/${two.body.import.id}/start`)).status).toBe(202);
    expect((await lastCheck(admin)).body).toEqual({ preview: null });
    expect(await waitDone(admin, org.id, two.body.import.id)).toMatchObject({ status: 'done', created: 2 });
  });
});
