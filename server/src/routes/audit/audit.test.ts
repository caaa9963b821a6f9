import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import type { Role } from '../../../../policies/roles';
import { allows, expectedOutcome, MATRIX_ROLES, roleMay, type Relation } from '../../../../policies/access/matrix';
import type { AuditEntryDto } from '../../../../policies/dto';
import { Membership } from '../../entities';
import { appendAudit, verifyChain, type AuditInput } from '../../services/audit';
import { signedIn, useHarness, type Client } from '../../test/harness';
import { createOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../../test/factories';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

interface EntryRow {
  id: string;
  organization_id: string | null;
  actor_user_id: string | null;
  action: string;
  subject_type: string;
  subject_id: string | null;
  before: unknown;
  after: unknown;
  request_id: string | null;
}

const newRequestId = () => `test-${randomUUID()}`;
const entriesFor = (requestId: string): Promise<EntryRow[]> =>
  h.ds.query('SELECT * FROM audit_entries WHERE request_id = $1 ORDER BY id', [requestId]);
const orgEntryIds = async (orgId: string): Promise<string[]> =>
  (await h.ds.query('SELECT id FROM audit_entries WHERE organization_id = $1 ORDER BY id DESC', [orgId])).map((r: { id: string }) =>
    String(r.id),
  );

/** Appends one entry in a transaction of its own, as a route would. */
const append = (orgId: string, input: Partial<AuditInput> = {}) =>
  h.ds.transaction((m) =>
    appendAudit(m, {
      organizationId: orgId,
      actorUserId: null,
      action: 'test.entry',
      subjectType: 'Test',
      requestId: newRequestId(),
      ...input,
    }),
  );

/** Polls for something written after the response was sent (refusals are audited off the request path). */
async function eventually<T>(probe: () => Promise<T | undefined>, ms = 10_000): Promise<T> {
  const until = Date.now() + ms;
  for (;;) {
    const value = await probe();
    if (value !== undefined) return value;
    if (Date.now() > until) throw new Error('timed out waiting');
    await new Promise((r) => setTimeout(r, 50));
  }
}

const playerOf = (org: TestOrg, role: Role): MemberRef =>
  ({ athlete: org.athlete, coach: org.coach, clinician: org.clinician, guardian: org.guardian, admin: org.admin })[role];

describe('every change writes an audit entry: actor, organization, before/after, request id', () => {
  let org: TestOrg;
  let admin: Client;
  let coach: Client;

  beforeAll(async () => {
    org = await createOrg(h.ds);
    admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    coach = await signedIn(h.app, org.coach.email, TEST_PASSWORD);
  });

  const byAdmin = { organization_id: () => org.id, actor_user_id: () => org.admin.userId };
  const expectEntry = (row: EntryRow, requestId: string, expected: Partial<EntryRow>) =>
    expect(row).toMatchObject({
      organization_id: byAdmin.organization_id(),
      actor_user_id: byAdmin.actor_user_id(),
      request_id: requestId,
      ...expected,
    });

  it('a role change', async () => {
    const rid = newRequestId();
    const { version } = await h.ds.getRepository(Membership).findOneByOrFail({ id: org.otherCoach.membershipId });
    const res = await admin
      .patch(`/api/orgs/${org.id}/people/${org.otherCoach.membershipId}`, { roles: ['coach', 'clinician'], version })
      .set('x-request-id', rid);
    expect(res.status).toBe(200);
    expect(res.headers['x-request-id']).toBe(rid);
    const [entry, ...more] = await entriesFor(rid);
    expect(more).toEqual([]);
    expectEntry(entry, rid, {
      action: 'membership.roles_changed',
      subject_type: 'Membership',
      subject_id: org.otherCoach.membershipId,
      before: { roles: ['coach'] },
      after: { roles: ['coach', 'clinician'] },
    });
  });

  it('removing a person', async () => {
    const rid = newRequestId();
    expect((await admin.delete(`/api/orgs/${org.id}/people/${org.otherClinician.membershipId}`).set('x-request-id', rid)).status).toBe(204);
    const entries = await entriesFor(rid);
    expect(entries).toHaveLength(1);
    expectEntry(entries[0], rid, {
      action: 'membership.removed',
      subject_id: org.otherClinician.membershipId,
      before: { roles: ['clinician'], active: true },
      after: { active: false },
    });
  });

  it('a care-team assignment and its removal', async () => {
    const body = { athleteId: org.otherAthlete.membershipId, memberId: org.otherCoach.membershipId, role: 'coach' };
    const rid = newRequestId();
    const res = await admin.post(`/api/orgs/${org.id}/care-team`, body).set('x-request-id', rid);
    expect(res.status).toBe(201);
    const [assigned] = await entriesFor(rid);
    expectEntry(assigned, rid, {
      action: 'care_team.assigned',
      subject_type: 'CareTeamAssignment',
      subject_id: res.body.id,
      before: null,
      after: body,
    });

    const rid2 = newRequestId();
    expect((await admin.delete(`/api/orgs/${org.id}/care-team/${res.body.id}`).set('x-request-id', rid2)).status).toBe(204);
    const [removed] = await entriesFor(rid2);
    expectEntry(removed, rid2, {
      action: 'care_team.unassigned',
      subject_id: res.body.id,
      before: { athleteId: body.athleteId, memberId: body.memberId, role: 'coach' },
    });
  });

  it('a guardian link and its removal', async () => {
    const body = { athleteId: org.otherAthlete.membershipId, guardianId: org.otherGuardian.membershipId };
    const rid = newRequestId();
    const res = await admin.post(`/api/orgs/${org.id}/guardian-links`, body).set('x-request-id', rid);
    expect(res.status).toBe(201);
    const [linked] = await entriesFor(rid);
    expectEntry(linked, rid, { action: 'guardian.linked', subject_type: 'GuardianLink', subject_id: res.body.id, after: body });

    const rid2 = newRequestId();
    expect((await admin.delete(`/api/orgs/${org.id}/guardian-links/${res.body.id}`).set('x-request-id', rid2)).status).toBe(204);
    const [unlinked] = await entriesFor(rid2);
    expectEntry(unlinked, rid2, { action: 'guardian.unlinked', subject_id: res.body.id, before: body });
  });

  it('an invitation and its withdrawal, and the entry never holds the token', async () => {
    const email = `invitee-${randomUUID().slice(0, 8)}@test.example`;
    const rid = newRequestId();
    const res = await admin.post(`/api/orgs/${org.id}/invitations`, { email, roles: ['coach'] }).set('x-request-id', rid);
    expect(res.status).toBe(201);
    const token = String(res.body.link).split('#')[1];
    expect(token.length).toBeGreaterThanOrEqual(22);
    const [created] = await entriesFor(rid);
    expectEntry(created, rid, {
      action: 'invitation.created',
      subject_type: 'Invitation',
      subject_id: res.body.id,
      after: expect.objectContaining({ email, roles: ['coach'] }),
    });
    expect(JSON.stringify(created)).not.toContain(token);

    const rid2 = newRequestId();
    expect((await admin.delete(`/api/orgs/${org.id}/invitations/${res.body.id}`).set('x-request-id', rid2)).status).toBe(204);
    const [revoked] = await entriesFor(rid2);
    expectEntry(revoked, rid2, { action: 'invitation.revoked', subject_id: res.body.id });
  });

  it('an athlete profile change, with the old and new values', async () => {
    const rid = newRequestId();
    const { version } = (await admin.get(`/api/orgs/${org.id}/athletes/${org.otherAthlete.membershipId}`)).body;
    const res = await admin
      .patch(`/api/orgs/${org.id}/athletes/${org.otherAthlete.membershipId}`, { sport: 'Judo', version })
      .set('x-request-id', rid);
    expect(res.status).toBe(200);
    const [entry] = await entriesFor(rid);
    expectEntry(entry, rid, {
      action: 'athlete.updated',
      subject_id: org.otherAthlete.membershipId,
      before: { sport: 'Test sport' },
      after: { sport: 'Judo' },
    });
  });

  it('a refused action writes access.refused with who, what and the request id; the refused change writes nothing else', async () => {
    const rid = newRequestId();
    const res = await coach
      .patch(`/api/orgs/${org.id}/people/${org.coach.membershipId}`, { roles: ['admin'], version: 1 })
      .set('x-request-id', rid);
    expect(res.status).toBe(403);
    const entries = await eventually(async () => {
      const rows = await entriesFor(rid);
      return rows.length ? rows : undefined;
    });
    expect(entries).toHaveLength(1);
    expect(entries[0]).toMatchObject({
      organization_id: org.id,
      actor_user_id: org.coach.userId,
      action: 'access.refused',
      request_id: rid,
      after: { method: 'PATCH', path: `/api/orgs/${org.id}/people/${org.coach.membershipId}`, message: res.body.error.message },
    });
  });

  it('a failed change writes no entry (a stale version answers 409 and the trail stays as it was)', async () => {
    const rid = newRequestId();
    const res = await admin
      .patch(`/api/orgs/${org.id}/people/${org.otherGuardian.membershipId}`, { roles: ['guardian', 'coach'], version: 999 })
      .set('x-request-id', rid);
    expect(res.status).toBe(409);
    expect(await entriesFor(rid)).toEqual([]);
  });

  it("the admin reads these entries through GET /audit, newest first, with the actor's name and only this organization's rows", async () => {
    const res = await admin.get(`/api/orgs/${org.id}/audit?limit=500`);
    expect(res.status).toBe(200);
    const entries = res.body.entries as AuditEntryDto[];
    expect(entries.map((e) => e.id)).toEqual(await orgEntryIds(org.id));
    const change = entries.find((e) => e.action === 'membership.roles_changed')!;
    expect(change).toMatchObject({
      actorUserId: org.admin.userId,
      actorName: org.admin.name,
      subjectType: 'Membership',
      after: { roles: ['coach', 'clinician'] },
    });
    expect(Object.keys(change).sort().join(' ')).toMatchInlineSnapshot(
      `"action actorName actorUserId after athleteId athleteName before id occurredAt requestId subjectId subjectType"`,
    );
    expect(res.body.nextBefore).toBeNull();
  });

  it("the organization's chain is intact after all of this", async () => {
    const res = await admin.get(`/api/orgs/${org.id}/audit/verify`);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ organizationId: org.id, intact: true, firstBrokenId: null });
    expect(res.body.entries).toBe((await orgEntryIds(org.id)).length);
  });
});

describe('who may read the audit trail, as the matrix says', () => {
  let org: TestOrg;
  let as: Record<Role, Client>;
  /** Three marker entries: about the linked athlete, about the other athlete, about no athlete. */
  const markers = {} as Record<'linked' | 'other' | 'none', string>;

  beforeAll(async () => {
    org = await createOrg(h.ds);
    as = {} as Record<Role, Client>;
    for (const role of MATRIX_ROLES) as[role] = await signedIn(h.app, playerOf(org, role).email, TEST_PASSWORD);
    const targets = { linked: org.athlete.membershipId, other: org.otherAthlete.membershipId, none: null };
    for (const [key, athleteId] of Object.entries(targets) as [keyof typeof markers, string | null][]) {
      const requestId = newRequestId();
      await append(org.id, { action: `test.marker_${key}`, athleteId, requestId });
      markers[key] = String((await entriesFor(requestId))[0].id);
    }
  });

  /** How each marker entry stands to the person playing `role`. */
  const relationOf = (role: Role, key: keyof typeof markers): Relation =>
    key === 'none' ? 'same-org' : key === 'other' || role === 'admin' ? 'other-athlete' : role === 'athlete' ? 'self' : 'own-care-team';

  it.each(MATRIX_ROLES)('GET /audit as %s lists exactly the entries the matrix lets them read, or refuses (403)', async (role) => {
    const res = await as[role].get(`/api/orgs/${org.id}/audit?limit=500`);
    if (!roleMay(role, 'AuditEntry', 'read')) {
      expect(res.status).toBe(403);
      expect(res.body.error.message).toBe(
        'Your role does not allow you to see the audit trail. Ask an admin of your organization if you need this.',
      );
      return;
    }
    expect(res.status).toBe(200);
    const ids = (res.body.entries as AuditEntryDto[]).map((e) => e.id);
    const keys = Object.keys(markers) as (keyof typeof markers)[];
    const expected = keys.filter((k) => allows(role, 'AuditEntry', 'read', relationOf(role, k)));
    expect(keys.filter((k) => ids.includes(markers[k]))).toEqual(expected);
    // A reader without the whole trail sees only entries about athletes they may follow.
    if (!allows(role, 'AuditEntry', 'read', 'same-org')) expect(ids).toEqual(expected.map((k) => markers[k]));
  });

  it.each(MATRIX_ROLES)('GET /audit/verify and /audit/export as %s answer as the matrix says', async (role) => {
    const verify = await as[role].get(`/api/orgs/${org.id}/audit/verify`);
    const outcome = expectedOutcome(role, 'AuditChain', 'read', 'same-org');
    expect(verify.status).toBe(outcome === 'allowed' ? 200 : 403);
    if (outcome === 'allowed') expect(verify.body).toMatchObject({ organizationId: org.id, intact: true });

    const csv = await as[role].get(`/api/orgs/${org.id}/audit/export?action=test.marker_`);
    if (!roleMay(role, 'AuditEntry', 'read')) {
      expect(csv.status).toBe(403);
      return;
    }
    expect(csv.status).toBe(200);
    expect(csv.headers['content-disposition']).toMatch(/^attachment;/);
    const keys = (Object.keys(markers) as (keyof typeof markers)[]).filter((k) => csv.text.includes(`test.marker_${k}`));
    expect(keys).toEqual(
      (Object.keys(markers) as (keyof typeof markers)[]).filter((k) => allows(role, 'AuditEntry', 'read', relationOf(role, k))),
    );
  });

  it('an admin of another organization gets 404 on list, export and verify; signed out gets 401', async () => {
    const orgB = await createOrg(h.ds);
    const adminB = await signedIn(h.app, orgB.admin.email, TEST_PASSWORD);
    for (const path of [`/api/orgs/${org.id}/audit`, `/api/orgs/${org.id}/audit/export`, `/api/orgs/${org.id}/audit/verify`]) {
      const res = await adminB.get(path);
      expect(res.status, path).toBe(404);
      expect(res.body.error.code).toBe('not_found');
      expect((await request(h.app).get(path)).status).toBe(401);
    }
    // Their own trail holds none of this organization's entries.
    const theirs = (await adminB.get(`/api/orgs/${orgB.id}/audit?limit=500`)).body.entries as AuditEntryDto[];
    expect(theirs.map((e) => e.id)).toEqual(await orgEntryIds(orgB.id));
    expect(theirs.map((e) => e.id)).not.toContain(markers.none);
  });
});

describe('the audit table is append-only', () => {
  /** Runs one statement in a transaction that is always rolled back, and returns its error, if any. */
  async function attempt(sql: string, params: unknown[] = []): Promise<(Error & { code?: string }) | null> {
    const qr = h.ds.createQueryRunner();
    await qr.connect();
    await qr.startTransaction();
    try {
      await qr.query(sql, params);
      return null;
    } catch (err) {
      return err as Error;
    } finally {
      await qr.rollbackTransaction();
      await qr.release();
    }
  }

  it('UPDATE, DELETE and TRUNCATE are refused by the database itself', async () => {
    const org = await createOrg(h.ds);
    await append(org.id);
    for (const [sql, op] of [
      [`UPDATE audit_entries SET action = 'forged' WHERE organization_id = $1`, 'UPDATE'],
      [`DELETE FROM audit_entries WHERE organization_id = $1`, 'DELETE'],
      ['TRUNCATE audit_entries', 'TRUNCATE'],
    ] as const) {
      const err = await attempt(sql, sql.includes('$1') ? [org.id] : []);
      expect(err, op).not.toBeNull();
      expect(err!.message).toBe(`audit_entries is append-only: ${op} refused`);
    }
    const rows: EntryRow[] = await h.ds.query('SELECT * FROM audit_entries WHERE organization_id = $1', [org.id]);
    expect(rows.map((r) => r.action)).toEqual(['test.entry']);
  });

  it('a tampered entry is found: /audit/verify reports intact:false and names that entry', async () => {
    // An organization of its own: chains are per organization, so no other test's chain breaks.
    const org = await createOrg(h.ds);
    const admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    for (const n of [1, 2, 3]) await append(org.id, { action: `test.entry_${n}`, after: { roles: ['coach'], n } });
    const healthy = await admin.get(`/api/orgs/${org.id}/audit/verify`);
    expect(healthy.body).toMatchObject({ intact: true, firstBrokenId: null });
    const [target]: { id: string }[] = await h.ds.query(
      `SELECT id FROM audit_entries WHERE organization_id = $1 AND action = 'test.entry_2'`,
      [org.id],
    );

    // As the table's owner, with the trigger off only inside this transaction (ALTER TABLE holds its lock to the end).
    await h.ds.transaction(async (m) => {
      await m.query('ALTER TABLE audit_entries DISABLE TRIGGER audit_entries_no_update_delete');
      await m.query(`UPDATE audit_entries SET after = '{"roles": ["admin"], "n": 2}' WHERE id = $1`, [target.id]);
      await m.query('ALTER TABLE audit_entries ENABLE TRIGGER audit_entries_no_update_delete');
    });

    const res = await admin.get(`/api/orgs/${org.id}/audit/verify`);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      organizationId: org.id,
      intact: false,
      firstBrokenId: String(target.id),
      reason: 'contents do not match the stored hash',
    });
    // The trigger is back on.
    expect(await attempt(`UPDATE audit_entries SET action = 'x' WHERE id = $1`, [target.id])).not.toBeNull();
  });
});

describe('the change and its audit entry commit or roll back together', () => {
  it('a transaction that writes a change and its entry, then fails, leaves neither', async () => {
    const org = await createOrg(h.ds);
    const rid = newRequestId();
    const id = org.otherCoach.membershipId;
    await expect(
      h.ds.transaction(async (m) => {
        await m.update(Membership, { id }, { roles: ['coach', 'admin'] });
        await appendAudit(m, {
          organizationId: org.id,
          actorUserId: org.admin.userId,
          action: 'membership.roles_changed',
          subjectType: 'Membership',
          subjectId: id,
          before: { roles: ['coach'] },
          after: { roles: ['coach', 'admin'] },
          requestId: rid,
        });
        expect(await entriesFor(rid)).toEqual([]); // not visible outside the transaction yet
        throw new Error('crash after the audit entry');
      }),
    ).rejects.toThrow('crash after the audit entry');
    expect((await h.ds.getRepository(Membership).findOneByOrFail({ id })).roles).toEqual(['coach']);
    expect(await entriesFor(rid)).toEqual([]);
  });

  it('when the audit entry cannot be written, the change is rolled back', async () => {
    const org = await createOrg(h.ds);
    const rid = newRequestId();
    const id = org.otherCoach.membershipId;
    await expect(
      h.ds.transaction(async (m) => {
        await m.update(Membership, { id }, { roles: ['coach', 'admin'] });
        // action is varchar(80): the insert fails inside the same transaction.
        await appendAudit(m, {
          organizationId: org.id,
          actorUserId: org.admin.userId,
          action: 'x'.repeat(81),
          subjectType: 'Membership',
          subjectId: id,
          requestId: rid,
        });
      }),
    ).rejects.toThrow(/too long/);
    expect((await h.ds.getRepository(Membership).findOneByOrFail({ id })).roles).toEqual(['coach']);
    expect(await entriesFor(rid)).toEqual([]);
    expect((await verifyChain(h.ds.manager, org.id)).intact).toBe(true);
  });

  it('appendAudit refuses to run outside a transaction', async () => {
    const org = await createOrg(h.ds);
    await expect(
      appendAudit(h.ds.manager, { organizationId: org.id, actorUserId: null, action: 'test.entry', subjectType: 'Test' }),
    ).rejects.toThrow(/inside a transaction/);
    expect(await orgEntryIds(org.id)).toEqual([]);
  });
});

describe('the hash chain under concurrency', () => {
  it('10 parallel writers in one organization extend the chain by 10, without a fork', async () => {
    const org = await createOrg(h.ds);
    await append(org.id, { action: 'test.genesis' });
    const before = await verifyChain(h.ds.manager, org.id);
    expect(before).toMatchObject({ intact: true, entries: 1 });
    await Promise.all(Array.from({ length: 10 }, (_, n) => append(org.id, { action: `test.parallel_${n}` })));
    const after = await verifyChain(h.ds.manager, org.id);
    expect(after).toMatchObject({ intact: true, entries: 11, firstBrokenId: null });
    const [{ links }] = await h.ds.query('SELECT count(DISTINCT prev_hash)::int AS links FROM audit_entries WHERE organization_id = $1', [
      org.id,
    ]);
    expect(links).toBe(11);
  });
});

describe('GET /audit filters and pages', () => {
  let org: TestOrg;
  let admin: Client;
  let days: { today: string; tomorrow: string; yesterday: string };
  const ACTIONS = [
    'care_team.assigned',
    'guardian.linked',
    'careXteam.lookalike',
    'care_team.unassigned',
    'membership.roles_changed',
    'care_team.assigned',
  ];

  beforeAll(async () => {
    org = await createOrg(h.ds);
    admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    for (const action of ACTIONS) await append(org.id, { action, actorUserId: org.admin.userId });
    // The database's own calendar, the one the filters compare in.
    [days] = await h.ds.query(
      `SELECT current_date::text AS today, (current_date + 1)::text AS tomorrow, (current_date - 1)::text AS yesterday`,
    );
  });

  const list = async (query: string) => {
    const res = await admin.get(`/api/orgs/${org.id}/audit?${query}`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    return res.body as { entries: AuditEntryDto[]; nextBefore: number | null };
  };

  it('action is a prefix, and its _ and % are matched literally', async () => {
    expect((await list('action=care_team.')).entries.map((e) => e.action)).toEqual([
      'care_team.assigned',
      'care_team.unassigned',
      'care_team.assigned',
    ]);
    expect((await list('action=care_')).entries.map((e) => e.action)).not.toContain('careXteam.lookalike');
    expect((await list('action=care%25')).entries).toEqual([]);
    expect((await list('action=membership.')).entries.map((e) => e.action)).toEqual(['membership.roles_changed']);
  });

  it('from and to are whole days, both included', async () => {
    const all = (await list('limit=500')).entries;
    expect(all.length).toBeGreaterThanOrEqual(ACTIONS.length);
    expect((await list(`from=${days.today}&to=${days.today}&limit=500`)).entries).toEqual(all);
    expect((await list(`from=${days.tomorrow}`)).entries).toEqual([]);
    expect((await list(`to=${days.yesterday}`)).entries).toEqual([]);
    expect((await list(`from=${days.yesterday}&to=${days.tomorrow}&action=care_team.`)).entries).toHaveLength(3);
  });

  it('pages newest first with before/nextBefore, each entry exactly once', async () => {
    const all = (await list('limit=500')).entries;
    const seen: string[] = [];
    let before: number | null = null;
    let pages = 0;
    do {
      const page: { entries: AuditEntryDto[]; nextBefore: number | null } = await list(`limit=2${before ? `&before=${before}` : ''}`);
      expect(page.entries.length).toBeLessThanOrEqual(2);
      seen.push(...page.entries.map((e) => e.id));
      before = page.nextBefore;
      if (before !== null) expect(String(before)).toBe(page.entries[page.entries.length - 1].id);
      pages += 1;
    } while (before !== null && pages < 20);
    expect(seen).toEqual(all.map((e) => e.id));
    expect(pages).toBe(Math.ceil(all.length / 2));
  });

  it('refuses unknown or malformed filters (400)', async () => {
    for (const query of ['organizationId=' + randomUUID(), 'from=yesterday', 'limit=0', 'limit=501', 'actorId=nope']) {
      const res = await admin.get(`/api/orgs/${org.id}/audit?${query}`);
      expect(res.status, query).toBe(400);
    }
  });
});
