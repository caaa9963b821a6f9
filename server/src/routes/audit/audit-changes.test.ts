import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import type { AuditEntryDto } from '../../../../policies/dto';
import { Membership } from '../../entities';
import { signedIn, useHarness, type Client } from '../../test/harness';
import { createOrg, TEST_PASSWORD, type TestOrg } from '../../test/factories';
import { auditProbes, eventually, newRequestId, type EntryRow } from '../../test/worlds/audit-fixtures';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { entriesFor, orgEntryIds } = auditProbes(h);

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
