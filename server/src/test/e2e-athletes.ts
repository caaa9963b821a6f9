import bcrypt from 'bcryptjs';
import type { DataSource } from 'typeorm';
import { AthleteProfile, CareTeamAssignment, GuardianLink, Membership, Organization, User } from '../entities';
import { DEMO_ORG_NAME, DEMO_PASSWORD } from '../seed/demo';

/**
 * Athletes with nothing under way, for browser tests that walk a story from its start (the demo's own
 * athletes are mid-season). In the demo organization, with the demo password: a minor with a guardian
 * and the same care team as the demo's 16-year-old, and an adult lifter. Loaded by scripts/test.ts before the browser tests;
 * the names are listed in e2e/helpers.ts (CLEAN).
 */
export const CLEAN_ATHLETES: {
  email: string;
  name: string;
  unitPref: 'kg' | 'lb';
  profile: { dateOfBirth: string; sport: string; position: string | null };
  guardian: { email: string; name: string } | null;
  coach: string;
  clinician: string;
}[] = [
  {
    email: 'nora.ellis@harborpoint.example',
    name: 'Nora Ellis',
    unitPref: 'lb',
    profile: { dateOfBirth: '2010-06-02', sport: 'Softball', position: 'Second base' },
    guardian: { email: 'ruth.ellis@harborpoint.example', name: 'Ruth Ellis' },
    coach: 'theo.lindqvist@harborpoint.example',
    clinician: 'priya.raman@harborpoint.example',
  },
  {
    email: 'kai.moreno@harborpoint.example',
    name: 'Kai Moreno',
    unitPref: 'kg',
    profile: { dateOfBirth: '2003-02-17', sport: 'Weightlifting', position: null },
    guardian: null,
    coach: 'rosa.delgado@harborpoint.example',
    clinician: 'priya.raman@harborpoint.example',
  },
];

export async function addCleanAthletes(ds: DataSource): Promise<void> {
  const hash = await bcrypt.hash(DEMO_PASSWORD, 4);
  await ds.transaction(async (m) => {
    const org = await m.findOneByOrFail(Organization, { name: DEMO_ORG_NAME });
    const memberOf = async (email: string) =>
      (await m.query(`SELECT m.id FROM memberships m JOIN users u ON u.id = m.user_id WHERE u.email = $1 AND m.organization_id = $2`, [
        email,
        org.id,
      ])) as { id: string }[];
    for (const a of CLEAN_ATHLETES) {
      if ((await memberOf(a.email)).length) continue;
      const user = await m.save(m.create(User, { email: a.email, displayName: a.name, passwordHash: hash, unitPref: a.unitPref }));
      const athlete = await m.save(m.create(Membership, { organizationId: org.id, userId: user.id, roles: ['athlete'], active: true }));
      await m.save(m.create(AthleteProfile, { id: athlete.id, organizationId: org.id, ...a.profile }));
      if (a.guardian) {
        const g = await m.save(
          m.create(User, { email: a.guardian.email, displayName: a.guardian.name, passwordHash: hash, unitPref: a.unitPref }),
        );
        const guardian = await m.save(m.create(Membership, { organizationId: org.id, userId: g.id, roles: ['guardian'], active: true }));
        await m.save(m.create(GuardianLink, { organizationId: org.id, athleteId: athlete.id, guardianId: guardian.id }));
      }
      const [coach] = await memberOf(a.coach);
      const [clinician] = await memberOf(a.clinician);
      await m.save(m.create(CareTeamAssignment, { organizationId: org.id, athleteId: athlete.id, memberId: coach.id, role: 'coach' }));
      await m.save(
        m.create(CareTeamAssignment, { organizationId: org.id, athleteId: athlete.id, memberId: clinician.id, role: 'clinician' }),
      );
    }
  });
}
