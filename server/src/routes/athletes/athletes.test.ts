import { beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import type { Role } from '../../../../policies/roles';
import { allows, expectedOutcome, MATRIX_ROLES, type Outcome, type Relation } from '../../../../policies/access/matrix';
import type { AthleteProfileDto } from '../../../../policies/dto';
import { AthleteProfile } from '../../entities';
import { signedIn, useHarness, type Client } from '../../test/harness';
import { createOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../../test/factories';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

const STATUS: Record<Outcome, number[]> = { allowed: [200], forbidden: [403], not_found: [404] };

/** The factory person who plays each role: the linked one (the athlete's own coach, clinician, guardian). */
const playerOf = (org: TestOrg, role: Role): MemberRef =>
  ({ athlete: org.athlete, coach: org.coach, clinician: org.clinician, guardian: org.guardian, admin: org.admin })[role];

/** How the factory's two athletes stand to each role: the linked one, and the one nobody is linked to. */
function relationTo(role: Role, which: 'athlete' | 'otherAthlete'): Relation {
  if (which === 'otherAthlete' || role === 'admin') return 'other-athlete';
  return role === 'athlete' ? 'self' : 'own-care-team';
}

const WHICH = ['athlete', 'otherAthlete'] as const;

async function signInAll(org: TestOrg): Promise<Record<Role, Client>> {
  const clients = {} as Record<Role, Client>;
  for (const role of MATRIX_ROLES) clients[role] = await signedIn(h.app, playerOf(org, role).email, TEST_PASSWORD);
  return clients;
}

describe('athletes, role by role as the access matrix says', () => {
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

  const profile = (id: string) => h.ds.getRepository(AthleteProfile).findOneByOrFail({ id });

  it.each(MATRIX_ROLES)('GET /athletes as %s lists exactly the athletes the matrix lets them read', async (role) => {
    const expected = WHICH.filter((w) => allows(role, 'Athlete', 'read', relationTo(role, w))).map((w) => org[w].membershipId);
    const res = await as[role].get(`/api/orgs/${org.id}/athletes`);
    expect(res.status).toBe(200);
    const body = res.body as AthleteProfileDto[];
    expect(body.map((a) => a.id).sort()).toEqual([...expected].sort());
    expect(body.every((a) => a.organizationId === org.id)).toBe(true);
  });

  it.each(MATRIX_ROLES)('GET /athletes/:id as %s answers each athlete as the matrix says (200, or 404 to hide it)', async (role) => {
    for (const which of WHICH) {
      const outcome = expectedOutcome(role, 'Athlete', 'read', relationTo(role, which));
      const res = await as[role].get(`/api/orgs/${org.id}/athletes/${org[which].membershipId}`);
      expect(STATUS[outcome], `${role} reading ${which}`).toContain(res.status);
      if (outcome === 'allowed') expect(res.body.id).toBe(org[which].membershipId);
      else expect(res.body.error.code).toBe(outcome);
    }
  });

  it.each(MATRIX_ROLES)(
    'PATCH /athletes/:id as %s answers each athlete as the matrix says and changes only what it allows',
    async (role) => {
      for (const which of WHICH) {
        const id = org[which].membershipId;
        const before = await profile(id);
        const outcome = expectedOutcome(role, 'Athlete', 'update', relationTo(role, which));
        const res = await as[role].patch(`/api/orgs/${org.id}/athletes/${id}`, { sport: `Rowing by ${role}`, version: before.version });
        expect(STATUS[outcome], `${role} changing ${which}: ${JSON.stringify(res.body)}`).toContain(res.status);
        const after = await profile(id);
        if (outcome === 'allowed') {
          expect(res.body.sport).toBe(`Rowing by ${role}`);
          expect(after.sport).toBe(`Rowing by ${role}`);
          expect(after.version).toBe(before.version + 1);
        } else {
          expect(res.body.error.code).toBe(outcome);
          if (outcome === 'forbidden') expect(res.body.error.message).toMatch(/does not allow you to change athlete profiles/);
          expect(after.sport).toBe(before.sport);
          expect(after.version).toBe(before.version);
        }
      }
    },
  );

  it.each(MATRIX_ROLES)(
    'the care team and guardians inside an athlete, as %s, are only records the matrix lets them read',
    async (role) => {
      const res = await as[role].get(`/api/orgs/${org.id}/athletes/${org.athlete.membershipId}`);
      expect(res.status).toBe(200);
      const athlete = res.body as AthleteProfileDto;
      const relation = relationTo(role, 'athlete');
      expect(athlete.careTeam.map((c) => c.memberId).sort()).toEqual([org.coach.membershipId, org.clinician.membershipId].sort());
      expect(allows(role, 'CareTeamAssignment', 'read', relation)).toBe(true);
      expect(athlete.guardians.map((g) => g.guardianId)).toEqual([org.guardian.membershipId]);
      const linkRelation: Relation = role === 'guardian' || role === 'athlete' ? 'self' : relation;
      expect(allows(role, 'GuardianLink', 'read', linkRelation)).toBe(true);
    },
  );

  it('the fields of an athlete, as each role receives them, are pinned: a clinical field leaking to a role shows up here', async () => {
    const shapes: Record<string, { athlete: string; careTeam: string; guardians: string }> = {};
    const keys = (o: object) => Object.keys(o).sort().join(' ');
    for (const role of MATRIX_ROLES) {
      const res = await as[role].get(`/api/orgs/${org.id}/athletes/${org.athlete.membershipId}`);
      expect(res.status).toBe(200);
      const a = res.body as AthleteProfileDto;
      shapes[role] = { athlete: keys(a), careTeam: keys(a.careTeam[0]), guardians: keys(a.guardians[0]) };
    }
    expect(shapes).toMatchInlineSnapshot(`
      {
        "admin": {
          "athlete": "age careTeam dateOfBirth displayName guardians id isMinor needsGuardian organizationId position sport version",
          "careTeam": "athleteId athleteName id memberEmail memberId memberName organizationId role",
          "guardians": "athleteId athleteName guardianId guardianName id organizationId",
        },
        "athlete": {
          "athlete": "age careTeam dateOfBirth displayName guardians id isMinor needsGuardian organizationId position sport version",
          "careTeam": "athleteId athleteName id memberEmail memberId memberName organizationId role",
          "guardians": "athleteId athleteName guardianId guardianName id organizationId",
        },
        "clinician": {
          "athlete": "age careTeam dateOfBirth displayName guardians id isMinor needsGuardian organizationId position sport version",
          "careTeam": "athleteId athleteName id memberEmail memberId memberName organizationId role",
          "guardians": "athleteId athleteName guardianId guardianName id organizationId",
        },
        "coach": {
          "athlete": "age careTeam dateOfBirth displayName guardians id isMinor needsGuardian organizationId position sport version",
          "careTeam": "athleteId athleteName id memberEmail memberId memberName organizationId role",
          "guardians": "athleteId athleteName guardianId guardianName id organizationId",
        },
        "guardian": {
          "athlete": "age careTeam dateOfBirth displayName guardians id isMinor needsGuardian organizationId position sport version",
          "careTeam": "athleteId athleteName id memberEmail memberId memberName organizationId role",
          "guardians": "athleteId athleteName guardianId guardianName id organizationId",
        },
      }
    `);
  });

  it("a coach with no athlete yet gets an empty list, and another team's athlete answers 404, not 403", async () => {
    const otherCoach = await signedIn(h.app, org.otherCoach.email, TEST_PASSWORD);
    const list = await otherCoach.get(`/api/orgs/${org.id}/athletes`);
    expect(list.status).toBe(200);
    expect(list.body).toEqual([]);
    const one = await otherCoach.get(`/api/orgs/${org.id}/athletes/${org.athlete.membershipId}`);
    expect(one.status).toBe(404);
    expect(one.body.error.code).toBe('not_found');
  });

  describe('another organization', () => {
    it("an admin of another organization gets 404 for this organization's athletes, list, record and change alike", async () => {
      const id = org.otherAthlete.membershipId;
      const before = await profile(id);
      const list = await adminB.get(`/api/orgs/${org.id}/athletes`);
      expect(list.status).toBe(404);
      expect(list.body.error.code).toBe('not_found');
      expect((await adminB.get(`/api/orgs/${org.id}/athletes/${id}`)).status).toBe(404);
      const patch = await adminB.patch(`/api/orgs/${org.id}/athletes/${id}`, { sport: 'Stolen', version: before.version });
      expect(patch.status).toBe(404);
      expect(await profile(id)).toEqual(before);
    });

    it("an admin asking through their own organization for another organization's athlete gets 404", async () => {
      const id = orgB.otherAthlete.membershipId;
      const before = await profile(id);
      expect((await as.admin.get(`/api/orgs/${org.id}/athletes/${id}`)).status).toBe(404);
      const patch = await as.admin.patch(`/api/orgs/${org.id}/athletes/${id}`, { sport: 'Stolen', version: before.version });
      expect(patch.status).toBe(404);
      expect(await profile(id)).toEqual(before);
    });

    it("a list never holds another organization's athletes", async () => {
      const mine = (await as.admin.get(`/api/orgs/${org.id}/athletes`)).body as AthleteProfileDto[];
      const theirs = (await adminB.get(`/api/orgs/${orgB.id}/athletes`)).body as AthleteProfileDto[];
      expect(mine.map((a) => a.id).sort()).toEqual([org.athlete.membershipId, org.otherAthlete.membershipId].sort());
      expect(theirs.map((a) => a.id).sort()).toEqual([orgB.athlete.membershipId, orgB.otherAthlete.membershipId].sort());
    });
  });

  describe('writes', () => {
    it('a PATCH carrying organizationId or an unknown field is refused (400) and changes nothing', async () => {
      const id = org.otherAthlete.membershipId;
      const before = await profile(id);
      for (const extra of [{ organizationId: orgB.id }, { displayName: 'Renamed' }, { diagnosis: 'ACL tear' }]) {
        const res = await as.admin.patch(`/api/orgs/${org.id}/athletes/${id}`, { sport: 'Changed', version: before.version, ...extra });
        expect(res.status).toBe(400);
        expect(res.body.error.code).toBe('validation_failed');
        expect(Object.keys(res.body.error.fields)).toEqual(Object.keys(extra));
      }
      expect(await profile(id)).toEqual(before);
    });

    it('a PATCH against an old version answers 409 version_conflict and keeps the newer change', async () => {
      const id = org.otherAthlete.membershipId;
      const { version } = await profile(id);
      const first = await as.admin.patch(`/api/orgs/${org.id}/athletes/${id}`, { position: 'Stroke', version });
      expect(first.status).toBe(200);
      expect(first.body.version).toBe(version + 1);
      const stale = await as.admin.patch(`/api/orgs/${org.id}/athletes/${id}`, { position: 'Bow', version });
      expect(stale.status).toBe(409);
      expect(stale.body.error.code).toBe('version_conflict');
      const after = await profile(id);
      expect(after.position).toBe('Stroke');
      expect(after.version).toBe(version + 1);
    });
  });

  it('signed out: 401 on the list and on a record', async () => {
    expect((await request(h.app).get(`/api/orgs/${org.id}/athletes`)).status).toBe(401);
    expect((await request(h.app).get(`/api/orgs/${org.id}/athletes/${org.athlete.membershipId}`)).status).toBe(401);
  });
});
