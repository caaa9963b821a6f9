import { randomUUID } from 'node:crypto';
import type { DataSource } from 'typeorm';
import bcrypt from 'bcryptjs';
import type { Role } from '../../../policies/roles';
import { seedExerciseLibrary } from '../services/exercise-library';
import { AthleteProfile, CareTeamAssignment, GuardianLink, Membership, Organization, User } from '../entities';

export const TEST_PASSWORD = 'long enough test passphrase';

// The people the factories make sign in over and over (about a third of a second of CPU per check at
// cost 12 with bcryptjs), so their shared password is stored at bcrypt's lowest cost, hashed once per
// worker. Passwords set through the app (invitations, resets, sign-up) still go through the configured
// cost, which session/passwords.test.ts holds at 12 or more (OWASP ASVS 5.0 V11.4.2).
let hashed: Promise<string> | null = null;
const passwordHash = () => (hashed ??= bcrypt.hash(TEST_PASSWORD, 4));

export interface MemberRef {
  userId: string;
  membershipId: string;
  email: string;
  name: string;
}

export async function createMember(
  ds: DataSource,
  organizationId: string,
  roles: Role[],
  opts: { name?: string; dateOfBirth?: string | null; email?: string } = {},
): Promise<MemberRef> {
  const tag = randomUUID().slice(0, 8);
  const email = opts.email ?? `${roles[0]}-${tag}@test.example`;
  const name = opts.name ?? `${roles[0]} ${tag}`;
  const user = await ds.getRepository(User).save({ email, displayName: name, passwordHash: await passwordHash(), unitPref: 'kg' });
  const membership = await ds.getRepository(Membership).save({ organizationId, userId: user.id, roles, active: true });
  if (roles.includes('athlete')) {
    await ds.getRepository(AthleteProfile).save({
      id: membership.id,
      organizationId,
      dateOfBirth: opts.dateOfBirth === undefined ? '2000-01-01' : opts.dateOfBirth,
      sport: 'Test sport',
      position: null,
    });
  }
  return { userId: user.id, membershipId: membership.id, email, name };
}

export interface TestOrg {
  id: string;
  admin: MemberRef;
  coach: MemberRef;
  clinician: MemberRef;
  athlete: MemberRef;
  guardian: MemberRef;
  /** An athlete of the same organization on nobody's care team. */
  otherAthlete: MemberRef;
  /** Staff of the same organization on no care team. */
  otherCoach: MemberRef;
  otherClinician: MemberRef;
  otherGuardian: MemberRef;
}

/**
 * A whole organization: admin; a minor athlete with a coach, a clinician and a guardian; and one more
 * of each role with no links, to prove that "same role, other athlete" is refused.
 */
export async function createOrg(ds: DataSource, name = `Org ${randomUUID().slice(0, 8)}`): Promise<TestOrg> {
  const org = await ds.getRepository(Organization).save({ name, emergencyNumber: '911' });
  const id = org.id;
  const [admin, coach, clinician, athlete, guardian, otherAthlete, otherCoach, otherClinician, otherGuardian] = await Promise.all([
    createMember(ds, id, ['admin']),
    createMember(ds, id, ['coach']),
    createMember(ds, id, ['clinician']),
    createMember(ds, id, ['athlete'], { dateOfBirth: '2010-03-14' }),
    createMember(ds, id, ['guardian']),
    createMember(ds, id, ['athlete']),
    createMember(ds, id, ['coach']),
    createMember(ds, id, ['clinician']),
    createMember(ds, id, ['guardian']),
  ]);
  await ds.getRepository(CareTeamAssignment).save([
    { organizationId: id, athleteId: athlete.membershipId, memberId: coach.membershipId, role: 'coach' },
    { organizationId: id, athleteId: athlete.membershipId, memberId: clinician.membershipId, role: 'clinician' },
  ]);
  await ds.getRepository(GuardianLink).save({ organizationId: id, athleteId: athlete.membershipId, guardianId: guardian.membershipId });
  await seedExerciseLibrary(ds.manager, id);
  return { id, admin, coach, clinician, athlete, guardian, otherAthlete, otherCoach, otherClinician, otherGuardian };
}
