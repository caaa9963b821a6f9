import { beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import type { Role } from '../../../../policies/roles';
import { allows, expectedOutcome, MATRIX_ROLES, type Outcome, type Relation } from '../../../../policies/access/matrix';
import type { PersonDto } from '../../../../policies/dto';
import { Membership } from '../../entities';
import { signedIn, useHarness, type Client } from '../../test/harness';
import { createOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../../test/factories';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

const STATUS: Record<Outcome, number> = { allowed: 200, forbidden: 403, not_found: 404 };
const MEMBERS = [
  'admin',
  'coach',
  'clinician',
  'athlete',
  'guardian',
  'otherAthlete',
  'otherCoach',
  'otherClinician',
  'otherGuardian',
] as const;
type MemberKey = (typeof MEMBERS)[number];

/** The factory person who plays each role: the athlete's own coach, clinician and guardian. */
const PLAYER: Record<Role, MemberKey> = {
  athlete: 'athlete',
  coach: 'coach',
  clinician: 'clinician',
  guardian: 'guardian',
  admin: 'admin',
};

/** How each member of the factory organization stands to the person playing `role`. */
function relationTo(role: Role, member: MemberKey): Relation {
  if (member === PLAYER[role]) return 'self';
  if (member === 'athlete') return role === 'admin' ? 'other-athlete' : 'own-care-team';
  if (member === 'otherAthlete') return 'other-athlete';
  return 'same-org';
}

const membership = (id: string) => h.ds.getRepository(Membership).findOneByOrFail({ id });

async function signInAll(org: TestOrg): Promise<Record<Role, Client>> {
  const clients = {} as Record<Role, Client>;
  for (const role of MATRIX_ROLES) clients[role] = await signedIn(h.app, org[PLAYER[role]].email, TEST_PASSWORD);
  return clients;
}

describe('people, role by role as the access matrix says', () => {
  let org: TestOrg;
  let orgB: TestOrg;
  let as: Record<Role, Client>;
  let adminB: Client;

  beforeAll(async () => {
    org = await createOrg(h.ds);
    orgB = await createOrg(h.ds);
    as = await signInAll(org);
    adminB = await signedIn(h.app, orgB.admin.email, TEST_PASSWORD);
  });

  it.each(MATRIX_ROLES)('GET /people as %s lists exactly the people the matrix lets them read', async (role) => {
    const expected = MEMBERS.filter((m) => allows(role, 'Membership', 'read', relationTo(role, m))).map((m) => org[m].membershipId);
    const res = await as[role].get(`/api/orgs/${org.id}/people`);
    expect(res.status).toBe(200);
    const people = res.body as PersonDto[];
    expect(people.map((p) => p.id).sort()).toEqual([...expected].sort());
    expect(people.every((p) => p.organizationId === org.id)).toBe(true);
  });

  it.each(MATRIX_ROLES)('GET /people/:id as %s answers each person as the matrix says (200, or 404 to hide them)', async (role) => {
    for (const m of MEMBERS) {
      const outcome = expectedOutcome(role, 'Membership', 'read', relationTo(role, m));
      const res = await as[role].get(`/api/orgs/${org.id}/people/${org[m].membershipId}`);
      expect(res.status, `${role} reading ${m}`).toBe(STATUS[outcome]);
      if (outcome === 'allowed') expect(res.body.id).toBe(org[m].membershipId);
    }
  });

  // Allowed changes end the changed person's sessions, so they run below, each in an organization of its own.
  const refusals = (action: 'update' | 'delete') =>
    MATRIX_ROLES.flatMap((role) => MEMBERS.map((m) => [role, m] as const)).filter(
      ([role, m]) => expectedOutcome(role, 'Membership', action, relationTo(role, m)) !== 'allowed',
    );

  it.each(MATRIX_ROLES.filter((r) => r !== 'admin'))(
    'PATCH /people/:id as %s (even to make themselves admin) is refused as the matrix says; nothing changes',
    async (role) => {
      const cases = refusals('update').filter(([r]) => r === role);
      expect(cases).toHaveLength(MEMBERS.length);
      for (const [, m] of cases) {
        const before = await membership(org[m].membershipId);
        const outcome = expectedOutcome(role, 'Membership', 'update', relationTo(role, m));
        const res = await as[role].patch(`/api/orgs/${org.id}/people/${before.id}`, { roles: ['admin'], version: before.version });
        expect(res.status, `${role} changing ${m}`).toBe(STATUS[outcome]);
        expect(res.body.error.code).toBe(outcome);
        if (outcome === 'forbidden') {
          expect(res.body.error.message).toBe(
            'Your role does not allow you to change people and roles. Ask an admin of your organization if you need this.',
          );
        }
        expect(await membership(before.id)).toEqual(before);
      }
    },
  );

  it.each(MATRIX_ROLES.filter((r) => r !== 'admin'))(
    'DELETE /people/:id as %s is refused as the matrix says; nobody is removed',
    async (role) => {
      for (const [, m] of refusals('delete').filter(([r]) => r === role)) {
        const outcome = expectedOutcome(role, 'Membership', 'delete', relationTo(role, m));
        const res = await as[role].delete(`/api/orgs/${org.id}/people/${org[m].membershipId}`);
        expect(res.status, `${role} removing ${m}`).toBe(STATUS[outcome]);
        expect((await membership(org[m].membershipId)).active).toBe(true);
      }
    },
  );

  it('the fields of a person, as each role receives them, are pinned: a field leaking to a role shows up here', async () => {
    const shapes: Record<string, { person: string; athlete: string | null }> = {};
    const keys = (o: object) => Object.keys(o).sort().join(' ');
    for (const role of MATRIX_ROLES) {
      const res = await as[role].get(`/api/orgs/${org.id}/people/${org.athlete.membershipId}`);
      expect(res.status).toBe(200);
      const p = res.body as PersonDto;
      shapes[role] = { person: keys(p), athlete: p.athlete ? keys(p.athlete) : null };
    }
    expect(shapes).toMatchInlineSnapshot(`
      {
        "admin": {
          "athlete": "age careTeam dateOfBirth displayName guardians id isMinor needsGuardian organizationId position sport version",
          "person": "athlete createdAt displayName email id organizationId roles userId version",
        },
        "athlete": {
          "athlete": "age careTeam dateOfBirth displayName guardians id isMinor needsGuardian organizationId position sport version",
          "person": "athlete createdAt displayName email id organizationId roles userId version",
        },
        "clinician": {
          "athlete": "age careTeam dateOfBirth displayName guardians id isMinor needsGuardian organizationId position sport version",
          "person": "athlete createdAt displayName email id organizationId roles userId version",
        },
        "coach": {
          "athlete": "age careTeam dateOfBirth displayName guardians id isMinor needsGuardian organizationId position sport version",
          "person": "athlete createdAt displayName email id organizationId roles userId version",
        },
        "guardian": {
          "athlete": "age careTeam dateOfBirth displayName guardians id isMinor needsGuardian organizationId position sport version",
          "person": "athlete createdAt displayName email id organizationId roles userId version",
        },
      }
    `);
  });

  describe('another organization', () => {
    it("an admin of another organization gets 404 for this organization's people: list, record, change and removal", async () => {
      const target = org.otherCoach.membershipId;
      const before = await membership(target);
      for (const res of [
        await adminB.get(`/api/orgs/${org.id}/people`),
        await adminB.get(`/api/orgs/${org.id}/people/${target}`),
        await adminB.patch(`/api/orgs/${org.id}/people/${target}`, { roles: ['admin'], version: before.version }),
        await adminB.delete(`/api/orgs/${org.id}/people/${target}`),
      ]) {
        expect(res.status).toBe(404);
        expect(res.body.error.code).toBe('not_found');
      }
      expect(await membership(target)).toEqual(before);
    });

    it("an admin reaching through their own organization for another organization's person gets 404", async () => {
      const target = orgB.otherCoach.membershipId;
      const before = await membership(target);
      expect((await as.admin.get(`/api/orgs/${org.id}/people/${target}`)).status).toBe(404);
      expect((await as.admin.patch(`/api/orgs/${org.id}/people/${target}`, { roles: ['admin'], version: before.version })).status).toBe(
        404,
      );
      expect((await as.admin.delete(`/api/orgs/${org.id}/people/${target}`)).status).toBe(404);
      expect(await membership(target)).toEqual(before);
    });
  });

  it('a PATCH carrying organizationId or an unknown field is refused (400, naming it) and changes nothing', async () => {
    const before = await membership(org.otherClinician.membershipId);
    for (const extra of [{ organizationId: orgB.id }, { userId: org.admin.userId }, { active: false }, { isOwner: true }]) {
      const res = await as.admin.patch(`/api/orgs/${org.id}/people/${before.id}`, {
        roles: ['clinician', 'admin'],
        version: before.version,
        ...extra,
      });
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(res.body.error.fields).toEqual({ [Object.keys(extra)[0]]: ['is not an accepted field'] });
      expect(res.body.error.message).toContain(Object.keys(extra)[0]);
    }
    expect(await membership(before.id)).toEqual(before);
  });

  it('an admin cannot remove their own admin role, nor remove themselves (409), and stays admin', async () => {
    const admin = as.admin;
    const before = await membership(org.admin.membershipId);
    const res = await admin.patch(`/api/orgs/${org.id}/people/${before.id}`, { roles: ['coach'], version: before.version });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('conflict');
    expect(res.body.error.message).toMatch(/cannot remove your own admin role/);
    const del = await admin.delete(`/api/orgs/${org.id}/people/${before.id}`);
    expect(del.status).toBe(409);
    expect(await membership(before.id)).toEqual(before);
    expect((await admin.get(`/api/orgs/${org.id}/people`)).status).toBe(200);
  });

  it('signed out: 401', async () => {
    expect((await request(h.app).get(`/api/orgs/${org.id}/people`)).status).toBe(401);
  });
});

describe('changing and removing people', () => {
  /** An organization of its own, with its admin signed in. */
  async function freshOrg(): Promise<{ org: TestOrg; admin: Client }> {
    const org = await createOrg(h.ds);
    return { org, admin: await signedIn(h.app, org.admin.email, TEST_PASSWORD) };
  }
  const athletePath = (org: TestOrg, who: MemberRef = org.athlete) => `/api/orgs/${org.id}/athletes/${who.membershipId}`;

  it('an admin changes roles with the current version; an old version then answers 409 and changes nothing', async () => {
    const { org, admin } = await freshOrg();
    const { version } = await membership(org.otherCoach.membershipId);
    const first = await admin.patch(`/api/orgs/${org.id}/people/${org.otherCoach.membershipId}`, {
      roles: ['coach', 'clinician'],
      version,
    });
    expect(first.status).toBe(200);
    expect(first.body.roles).toEqual(['coach', 'clinician']);
    expect(first.body.version).toBe(version + 1);
    const stale = await admin.patch(`/api/orgs/${org.id}/people/${org.otherCoach.membershipId}`, { roles: ['admin'], version });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('version_conflict');
    expect(stale.body.error.message).toMatch(/changed this person/);
    const after = await membership(org.otherCoach.membershipId);
    expect(after.roles).toEqual(['coach', 'clinician']);
    expect(after.version).toBe(version + 1);
  });

  it("a role change takes effect at once: the former coach's sessions end, and signed in again they get 404 on the athlete", async () => {
    const { org, admin } = await freshOrg();
    const laptop = await signedIn(h.app, org.coach.email, TEST_PASSWORD);
    const phone = await signedIn(h.app, org.coach.email, TEST_PASSWORD);
    expect((await laptop.get(athletePath(org))).status).toBe(200);
    const { version } = await membership(org.coach.membershipId);
    const res = await admin.patch(`/api/orgs/${org.id}/people/${org.coach.membershipId}`, { roles: ['clinician'], version });
    expect(res.status).toBe(200);
    // Both of their sessions are gone (a new session id after a role change), the admin's is not.
    expect((await laptop.get(athletePath(org))).status).toBe(401);
    expect((await phone.get(`/api/orgs/${org.id}`)).status).toBe(401);
    expect((await admin.get(`/api/orgs/${org.id}/people`)).status).toBe(200);
    // The care-team row is still there, but it counted only while they held the coach role.
    const again = await signedIn(h.app, org.coach.email, TEST_PASSWORD);
    const one = await again.get(athletePath(org));
    expect(one.status).toBe(404);
    expect(one.body.error.code).toBe('not_found');
    const list = await again.get(`/api/orgs/${org.id}/athletes`);
    expect(list.status).toBe(200);
    expect(list.body).toEqual([]);
  });

  it("a removed member's sessions end, the organization answers them 404, and they leave every list", async () => {
    const { org, admin } = await freshOrg();
    const coach = await signedIn(h.app, org.coach.email, TEST_PASSWORD);
    expect((await coach.get(athletePath(org))).status).toBe(200);
    const del = await admin.delete(`/api/orgs/${org.id}/people/${org.coach.membershipId}`);
    expect(del.status).toBe(204);
    expect((await coach.get(athletePath(org))).status).toBe(401);
    // Their account stays and can sign in, but this organization no longer exists for them.
    const again = await signedIn(h.app, org.coach.email, TEST_PASSWORD);
    const session = await again.get('/api/session');
    expect(session.body.memberships.map((m: { organizationId: string }) => m.organizationId)).not.toContain(org.id);
    for (const path of [`/api/orgs/${org.id}`, `/api/orgs/${org.id}/athletes`, athletePath(org)]) {
      const res = await again.get(path);
      expect(res.status, path).toBe(404);
    }
    const people = (await admin.get(`/api/orgs/${org.id}/people`)).body as PersonDto[];
    expect(people.map((p) => p.id)).not.toContain(org.coach.membershipId);
    expect((await admin.get(`/api/orgs/${org.id}/people/${org.coach.membershipId}`)).status).toBe(404);
    // A removed coach is no longer shown on the athlete's care team.
    const athlete = (await admin.get(athletePath(org))).body;
    expect(athlete.careTeam.map((c: { memberId: string }) => c.memberId)).toEqual([org.clinician.membershipId]);
  });

  it("removing an athlete ends their care team's and guardian's access to them at once", async () => {
    const { org, admin } = await freshOrg();
    const guardian = await signedIn(h.app, org.guardian.email, TEST_PASSWORD);
    expect((await guardian.get(athletePath(org))).status).toBe(200);
    expect((await admin.delete(`/api/orgs/${org.id}/people/${org.athlete.membershipId}`)).status).toBe(204);
    expect((await guardian.get(athletePath(org))).status).toBe(404);
    expect((await guardian.get(`/api/orgs/${org.id}/athletes`)).body).toEqual([]);
  });
});
