import { beforeAll, describe, expect, it } from 'vitest';
import type { Role } from '../../../../policies/roles';
import { expectedOutcome, MATRIX_ROLES, type Relation } from '../../../../policies/access/matrix';
import { CareTeamAssignment } from '../../entities';
import { Client, signedIn, useHarness } from '../../test/harness';
import { createMember, createOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../../test/factories';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

const playerOf = (org: TestOrg, role: Role): MemberRef =>
  ({ athlete: org.athlete, coach: org.coach, clinician: org.clinician, guardian: org.guardian, admin: org.admin })[role];

/** How the factory's linked athlete stands to each role. */
const linkedRelation = (role: Role): Relation => (role === 'athlete' ? 'self' : role === 'admin' ? 'other-athlete' : 'own-care-team');

const assignments = (athleteId: string) => h.ds.getRepository(CareTeamAssignment).find({ where: { athleteId }, order: { role: 'ASC' } });

describe('care-team assignments, role by role as the access matrix says', () => {
  let org: TestOrg;
  let orgB: TestOrg;
  let as: Record<Role, Client>;
  let adminB: Client;

  beforeAll(async () => {
    org = await createOrg(h.ds);
    orgB = await createOrg(h.ds);
    as = {} as Record<Role, Client>;
    for (const role of MATRIX_ROLES) as[role] = await signedIn(h.app, playerOf(org, role).email, TEST_PASSWORD);
    adminB = await signedIn(h.app, orgB.admin.email, TEST_PASSWORD);
  });

  const refusedRoles = (action: 'create' | 'delete') =>
    MATRIX_ROLES.filter((role) => expectedOutcome(role, 'CareTeamAssignment', action, linkedRelation(role)) !== 'allowed');

  it('only admins may assign or unassign, per the matrix', () => {
    expect(refusedRoles('create')).toEqual(['athlete', 'coach', 'clinician', 'guardian']);
    expect(refusedRoles('delete')).toEqual(['athlete', 'coach', 'clinician', 'guardian']);
  });

  it.each(refusedRoles('create'))(
    'POST /care-team as %s (even adding themselves to their own athlete) → 403 with a reason; nothing is added',
    async (role) => {
      const before = await assignments(org.athlete.membershipId);
      const res = await as[role].post(`/api/orgs/${org.id}/care-team`, {
        athleteId: org.athlete.membershipId,
        memberId: org.otherCoach.membershipId,
        role: 'coach',
      });
      expect(res.status).toBe(403);
      expect(res.body.error).toEqual({
        code: 'forbidden',
        message: 'Your role does not allow you to add to care teams. Ask an admin of your organization if you need this.',
      });
      expect(await assignments(org.athlete.membershipId)).toEqual(before);
    },
  );

  it.each(refusedRoles('delete'))('DELETE /care-team/:id as %s → 403; the assignment stays', async (role) => {
    const before = await assignments(org.athlete.membershipId);
    const coachRow = before.find((a) => a.role === 'coach')!;
    const res = await as[role].delete(`/api/orgs/${org.id}/care-team/${coachRow.id}`);
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('forbidden');
    expect(await assignments(org.athlete.membershipId)).toEqual(before);
  });

  describe('validation (as admin)', () => {
    const post = (body: object) => as.admin.post(`/api/orgs/${org.id}/care-team`, body);

    it('memberId must hold the role given: 400 naming memberId', async () => {
      const res = await post({ athleteId: org.otherAthlete.membershipId, memberId: org.clinician.membershipId, role: 'coach' });
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(res.body.error.message).toContain('memberId');
      expect(res.body.error.fields).toEqual({ memberId: ['must be a coach in this organization'] });
      expect(await assignments(org.otherAthlete.membershipId)).toEqual([]);
    });

    it('memberId from another organization: 400 naming memberId', async () => {
      const res = await post({ athleteId: org.otherAthlete.membershipId, memberId: orgB.otherCoach.membershipId, role: 'coach' });
      expect(res.status).toBe(400);
      expect(Object.keys(res.body.error.fields)).toEqual(['memberId']);
      expect(await assignments(org.otherAthlete.membershipId)).toEqual([]);
    });

    it('athleteId must be an athlete of this organization: 400 naming athleteId', async () => {
      for (const athleteId of [org.otherGuardian.membershipId, orgB.otherAthlete.membershipId]) {
        const res = await post({ athleteId, memberId: org.otherCoach.membershipId, role: 'coach' });
        expect(res.status).toBe(400);
        expect(Object.keys(res.body.error.fields)).toEqual(['athleteId']);
        expect(await assignments(athleteId)).toEqual([]);
      }
    });

    it('role must be coach or clinician, and unknown fields are refused', async () => {
      const base = { athleteId: org.otherAthlete.membershipId, memberId: org.otherGuardian.membershipId };
      const bad = await post({ ...base, role: 'guardian' });
      expect(bad.status).toBe(400);
      expect(Object.keys(bad.body.error.fields)).toEqual(['role']);
      const extra = await post({ ...base, role: 'coach', memberId: org.otherCoach.membershipId, organizationId: orgB.id });
      expect(extra.status).toBe(400);
      expect(extra.body.error.fields).toEqual({ organizationId: ['is not an accepted field'] });
      expect(await assignments(org.otherAthlete.membershipId)).toEqual([]);
    });

    it('the same person twice in the same role: 409, still one row', async () => {
      const before = await assignments(org.athlete.membershipId);
      const res = await post({ athleteId: org.athlete.membershipId, memberId: org.coach.membershipId, role: 'coach' });
      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('conflict');
      expect(res.body.error.message).toMatch(/already on this athlete's care team as coach/);
      expect(await assignments(org.athlete.membershipId)).toEqual(before);
    });
  });

  describe('another organization', () => {
    it('an admin of another organization gets 404 assigning or unassigning here, and nothing changes', async () => {
      const before = await assignments(org.athlete.membershipId);
      const post = await adminB.post(`/api/orgs/${org.id}/care-team`, {
        athleteId: org.otherAthlete.membershipId,
        memberId: org.otherCoach.membershipId,
        role: 'coach',
      });
      expect(post.status).toBe(404);
      const del = await adminB.delete(`/api/orgs/${org.id}/care-team/${before[0].id}`);
      expect(del.status).toBe(404);
      // Through their own organization's path, this organization's assignment does not exist either.
      const viaOwn = await adminB.delete(`/api/orgs/${orgB.id}/care-team/${before[0].id}`);
      expect(viaOwn.status).toBe(404);
      expect(await assignments(org.athlete.membershipId)).toEqual(before);
      expect(await assignments(org.otherAthlete.membershipId)).toEqual([]);
    });
  });

  it('signed out: 401', async () => {
    const anonymous = await Client.anonymous(h.app);
    const res = await anonymous.post(`/api/orgs/${org.id}/care-team`, {
      athleteId: org.otherAthlete.membershipId,
      memberId: org.otherCoach.membershipId,
      role: 'coach',
    });
    expect(res.status).toBe(401);
    expect(await assignments(org.otherAthlete.membershipId)).toEqual([]);
  });
});

describe('care-team changes take effect at once', () => {
  // One organization; each test works on its own athlete or member, so none depends on another.
  let org: TestOrg;
  let admin: Client;
  beforeAll(async () => {
    org = await createOrg(h.ds);
    admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
  });

  it('assigning opens the athlete to the coach on their next request; unassigning closes it (404) on the one after', async () => {
    const coach = await signedIn(h.app, org.otherCoach.email, TEST_PASSWORD);
    const path = `/api/orgs/${org.id}/athletes/${org.otherAthlete.membershipId}`;
    expect((await coach.get(path)).status).toBe(404);

    const assigned = await admin.post(`/api/orgs/${org.id}/care-team`, {
      athleteId: org.otherAthlete.membershipId,
      memberId: org.otherCoach.membershipId,
      role: 'coach',
    });
    expect(assigned.status).toBe(201);
    expect(assigned.body).toMatchObject({
      organizationId: org.id,
      athleteId: org.otherAthlete.membershipId,
      memberId: org.otherCoach.membershipId,
      memberName: org.otherCoach.name,
      role: 'coach',
    });
    expect((await coach.get(path)).status).toBe(200);
    expect((await coach.get(`/api/orgs/${org.id}/athletes`)).body.map((a: { id: string }) => a.id)).toEqual([
      org.otherAthlete.membershipId,
    ]);

    expect((await admin.delete(`/api/orgs/${org.id}/care-team/${assigned.body.id}`)).status).toBe(204);
    const after = await coach.get(path);
    expect(after.status).toBe(404);
    expect(after.body.error.code).toBe('not_found');
    expect((await coach.get(`/api/orgs/${org.id}/athletes`)).body).toEqual([]);
    expect(await assignments(org.otherAthlete.membershipId)).toEqual([]);
  });

  it("taking the athlete's own coach off the care team ends their access on the next request, while the clinician keeps theirs", async () => {
    const coach = await signedIn(h.app, org.coach.email, TEST_PASSWORD);
    const path = `/api/orgs/${org.id}/athletes/${org.athlete.membershipId}`;
    expect((await coach.get(path)).status).toBe(200);
    const row = (await assignments(org.athlete.membershipId)).find((a) => a.role === 'coach')!;
    expect((await admin.delete(`/api/orgs/${org.id}/care-team/${row.id}`)).status).toBe(204);
    expect((await coach.get(path)).status).toBe(404);
    expect((await coach.get(`/api/orgs/${org.id}/people/${org.athlete.membershipId}`)).status).toBe(404);
    const remaining = await assignments(org.athlete.membershipId);
    expect(remaining.map((a) => a.memberId)).toEqual([org.clinician.membershipId]);
    // Removing it twice: it is gone.
    expect((await admin.delete(`/api/orgs/${org.id}/care-team/${row.id}`)).status).toBe(404);
  });

  it('a clinician assignment opens the athlete to the clinician only in that role', async () => {
    // A person who is both coach and clinician, assigned as clinician, then stripped of the clinician role.
    const org = await createOrg(h.ds);
    const both = await createMember(h.ds, org.id, ['coach', 'clinician']);
    await h.ds
      .getRepository(CareTeamAssignment)
      .save({ organizationId: org.id, athleteId: org.otherAthlete.membershipId, memberId: both.membershipId, role: 'clinician' });
    const client = await signedIn(h.app, both.email, TEST_PASSWORD);
    expect((await client.get(`/api/orgs/${org.id}/athletes/${org.otherAthlete.membershipId}`)).status).toBe(200);
    await h.ds.query(`UPDATE memberships SET roles = '{coach}' WHERE id = $1`, [both.membershipId]);
    expect((await client.get(`/api/orgs/${org.id}/athletes/${org.otherAthlete.membershipId}`)).status).toBe(404);
  });
});
