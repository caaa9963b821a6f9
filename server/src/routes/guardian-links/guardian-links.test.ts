import { afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import type { Role } from '../../../../policies/roles';
import { expectedOutcome, MATRIX_ROLES, type Relation } from '../../../../policies/access/matrix';
import { GuardianLink } from '../../entities';
import { Client, signedIn, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../../test/factories';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

const playerOf = (org: TestOrg, role: Role): MemberRef =>
  ({ athlete: org.athlete, coach: org.coach, clinician: org.clinician, guardian: org.guardian, admin: org.admin })[role];

/** How the factory's guardian link (linked guardian → linked athlete) stands to each role. */
const linkRelation = (role: Role): Relation =>
  role === 'athlete' || role === 'guardian' ? 'self' : role === 'admin' ? 'other-athlete' : 'own-care-team';

const links = (athleteId: string) => h.ds.getRepository(GuardianLink).find({ where: { athleteId }, order: { guardianId: 'ASC' } });

describe('guardian links, role by role as the access matrix says', () => {
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
    MATRIX_ROLES.filter((role) => expectedOutcome(role, 'GuardianLink', action, linkRelation(role)) !== 'allowed');

  it('only admins may link or unlink, per the matrix', () => {
    expect(refusedRoles('create')).toEqual(['athlete', 'coach', 'clinician', 'guardian']);
    expect(refusedRoles('delete')).toEqual(['athlete', 'coach', 'clinician', 'guardian']);
  });

  it.each(refusedRoles('create'))(
    'POST /guardian-links as %s (e.g. a guardian linking themselves to another child) → 403 with a reason; nothing is linked',
    async (role) => {
      const res = await as[role].post(`/api/orgs/${org.id}/guardian-links`, {
        athleteId: org.otherAthlete.membershipId,
        guardianId: org.guardian.membershipId,
      });
      expect(res.status).toBe(403);
      expect(res.body.error).toEqual({
        code: 'forbidden',
        message: 'Your role does not allow you to add to guardian links. Ask an admin of your organization if you need this.',
      });
      expect(await links(org.otherAthlete.membershipId)).toEqual([]);
    },
  );

  it.each(refusedRoles('delete'))('DELETE /guardian-links/:id as %s → 403; the link stays', async (role) => {
    const before = await links(org.athlete.membershipId);
    const res = await as[role].delete(`/api/orgs/${org.id}/guardian-links/${before[0].id}`);
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('forbidden');
    expect(await links(org.athlete.membershipId)).toEqual(before);
  });

  describe('validation (as admin)', () => {
    const post = (body: object) => as.admin.post(`/api/orgs/${org.id}/guardian-links`, body);

    it('guardianId must be a guardian of this organization: 400 naming guardianId', async () => {
      for (const guardianId of [org.otherCoach.membershipId, org.otherAthlete.membershipId, orgB.otherGuardian.membershipId]) {
        const res = await post({ athleteId: org.otherAthlete.membershipId, guardianId });
        expect(res.status).toBe(400);
        expect(res.body.error.message).toContain('guardianId');
        expect(res.body.error.fields).toEqual({ guardianId: ['must be a guardian in this organization'] });
      }
      expect(await links(org.otherAthlete.membershipId)).toEqual([]);
    });

    it('athleteId must be an athlete of this organization: 400 naming athleteId', async () => {
      for (const athleteId of [org.otherGuardian.membershipId, orgB.otherAthlete.membershipId]) {
        const res = await post({ athleteId, guardianId: org.otherGuardian.membershipId });
        expect(res.status).toBe(400);
        expect(Object.keys(res.body.error.fields)).toEqual(['athleteId']);
        expect(await links(athleteId)).toEqual([]);
      }
    });

    it('unknown fields and malformed ids are refused', async () => {
      const extra = await post({
        athleteId: org.otherAthlete.membershipId,
        guardianId: org.otherGuardian.membershipId,
        organizationId: orgB.id,
      });
      expect(extra.status).toBe(400);
      expect(extra.body.error.fields).toEqual({ organizationId: ['is not an accepted field'] });
      const malformed = await post({ athleteId: 'not-an-id', guardianId: org.otherGuardian.membershipId });
      expect(malformed.status).toBe(400);
      expect(Object.keys(malformed.body.error.fields)).toEqual(['athleteId']);
      expect(await links(org.otherAthlete.membershipId)).toEqual([]);
    });

    it('the same guardian twice: 409, still one link', async () => {
      const before = await links(org.athlete.membershipId);
      const res = await post({ athleteId: org.athlete.membershipId, guardianId: org.guardian.membershipId });
      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('conflict');
      expect(await links(org.athlete.membershipId)).toEqual(before);
    });
  });

  it('an admin of another organization gets 404 linking or unlinking here, and nothing changes', async () => {
    const before = await links(org.athlete.membershipId);
    const post = await adminB.post(`/api/orgs/${org.id}/guardian-links`, {
      athleteId: org.otherAthlete.membershipId,
      guardianId: org.otherGuardian.membershipId,
    });
    expect(post.status).toBe(404);
    expect((await adminB.delete(`/api/orgs/${org.id}/guardian-links/${before[0].id}`)).status).toBe(404);
    expect((await adminB.delete(`/api/orgs/${orgB.id}/guardian-links/${before[0].id}`)).status).toBe(404);
    expect(await links(org.athlete.membershipId)).toEqual(before);
    expect(await links(org.otherAthlete.membershipId)).toEqual([]);
  });

  it('signed out: 401', async () => {
    const anonymous = await Client.anonymous(h.app);
    const res = await anonymous.post(`/api/orgs/${org.id}/guardian-links`, {
      athleteId: org.otherAthlete.membershipId,
      guardianId: org.otherGuardian.membershipId,
    });
    expect(res.status).toBe(401);
    expect(await links(org.otherAthlete.membershipId)).toEqual([]);
  });
});

describe('guardian-link changes take effect at once', () => {
  // One organization; each test works on its own athlete, so none depends on another.
  let org: TestOrg;
  let admin: Client;
  beforeAll(async () => {
    org = await createOrg(h.ds);
    admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
  });
  afterEach(() => {
    vi.useRealTimers();
  });

  it('linking opens the athlete to the guardian on their next request; unlinking closes it (404) on the one after', async () => {
    const guardian = await signedIn(h.app, org.otherGuardian.email, TEST_PASSWORD);
    const path = `/api/orgs/${org.id}/athletes/${org.otherAthlete.membershipId}`;
    expect((await guardian.get(path)).status).toBe(404);
    expect((await guardian.get(`/api/orgs/${org.id}/athletes`)).body).toEqual([]);

    const linked = await admin.post(`/api/orgs/${org.id}/guardian-links`, {
      athleteId: org.otherAthlete.membershipId,
      guardianId: org.otherGuardian.membershipId,
    });
    expect(linked.status).toBe(201);
    expect(linked.body).toMatchObject({
      organizationId: org.id,
      athleteId: org.otherAthlete.membershipId,
      guardianId: org.otherGuardian.membershipId,
      guardianName: org.otherGuardian.name,
    });
    expect((await guardian.get(path)).status).toBe(200);
    expect((await guardian.get(`/api/orgs/${org.id}/people/${org.otherAthlete.membershipId}`)).status).toBe(200);

    expect((await admin.delete(`/api/orgs/${org.id}/guardian-links/${linked.body.id}`)).status).toBe(204);
    const after = await guardian.get(path);
    expect(after.status).toBe(404);
    expect(after.body.error.code).toBe('not_found');
    expect((await guardian.get(`/api/orgs/${org.id}/people/${org.otherAthlete.membershipId}`)).status).toBe(404);
    expect(await links(org.otherAthlete.membershipId)).toEqual([]);
  });

  it("unlinking a minor's only guardian flags the athlete as needing one", async () => {
    // The athlete (born 2010-03-14) is a minor on this pinned day, whenever the test runs.
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(new Date('2027-06-01T12:00:00Z'));
    const onThatDay = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    const path = `/api/orgs/${org.id}/athletes/${org.athlete.membershipId}`;
    const before = (await onThatDay.get(path)).body;
    expect(before).toMatchObject({ isMinor: true, needsGuardian: false });
    const [link] = await links(org.athlete.membershipId);
    expect((await onThatDay.delete(`/api/orgs/${org.id}/guardian-links/${link.id}`)).status).toBe(204);
    expect((await onThatDay.get(path)).body).toMatchObject({ isMinor: true, needsGuardian: true, guardians: [] });
  });
});
