import type { DataSource, EntityManager } from 'typeorm';
import bcrypt from 'bcryptjs';
import type { Role } from '../../../policies/roles';
import { AthleteProfile, CareTeamAssignment, GuardianLink, Membership, Organization, User } from '../entities';
import { appendAudit } from '../services/audit';

/** Invented people in an invented facility; any likeness to real people is accidental. */
export const DEMO_ORG_NAME = 'Harbor Point Performance';
export const DEMO_PASSWORD = 'harbor-point-demo-2026';

interface DemoPerson {
  key: string;
  email: string;
  name: string;
  roles: Role[];
  athlete?: { dateOfBirth: string; sport: string; position: string | null };
}

export const DEMO_PEOPLE: DemoPerson[] = [
  { key: 'admin', email: 'dana.okafor@harborpoint.example', name: 'Dana Okafor', roles: ['admin'] },
  { key: 'coachTheo', email: 'theo.lindqvist@harborpoint.example', name: 'Theo Lindqvist', roles: ['coach'] },
  { key: 'coachRosa', email: 'rosa.delgado@harborpoint.example', name: 'Rosa Delgado', roles: ['coach'] },
  { key: 'clinicianPriya', email: 'priya.raman@harborpoint.example', name: 'Priya Raman, ATC', roles: ['clinician'] },
  { key: 'clinicianMarcus', email: 'marcus.bell@harborpoint.example', name: 'Marcus Bell, DPT', roles: ['clinician'] },
  { key: 'maya', email: 'maya.torres@harborpoint.example', name: 'Maya Torres', roles: ['athlete'],
    athlete: { dateOfBirth: '2010-03-14', sport: 'Softball', position: 'Shortstop' } },
  { key: 'jordan', email: 'jordan.pike@harborpoint.example', name: 'Jordan Pike', roles: ['athlete'],
    athlete: { dateOfBirth: '2007-01-22', sport: 'Rowing', position: 'Stroke seat' } },
  { key: 'sam', email: 'sam.whitfield@harborpoint.example', name: 'Sam Whitfield', roles: ['athlete'],
    athlete: { dateOfBirth: '2004-08-30', sport: 'Basketball', position: 'Guard' } },
  { key: 'ava', email: 'ava.chen@harborpoint.example', name: 'Ava Chen', roles: ['athlete'],
    athlete: { dateOfBirth: '2009-05-05', sport: 'Volleyball', position: 'Libero' } },
  { key: 'luis', email: 'luis.romero@harborpoint.example', name: 'Luis Romero', roles: ['athlete'],
    athlete: { dateOfBirth: '2002-11-09', sport: 'Weightlifting', position: null } },
  { key: 'elena', email: 'elena.torres@harborpoint.example', name: 'Elena Torres', roles: ['guardian'] },
  { key: 'wei', email: 'wei.chen@harborpoint.example', name: 'Wei Chen', roles: ['guardian'] },
];

const CARE_TEAMS: [athlete: string, member: string, role: 'coach' | 'clinician'][] = [
  ['maya', 'coachTheo', 'coach'],
  ['maya', 'clinicianPriya', 'clinician'],
  ['jordan', 'coachTheo', 'coach'],
  ['jordan', 'clinicianMarcus', 'clinician'],
  ['sam', 'coachRosa', 'coach'],
  ['sam', 'clinicianMarcus', 'clinician'],
  ['ava', 'coachRosa', 'coach'],
  ['ava', 'clinicianPriya', 'clinician'],
  ['luis', 'coachRosa', 'coach'],
  ['luis', 'clinicianPriya', 'clinician'],
];

const GUARDIANS: [athlete: string, guardian: string][] = [
  ['maya', 'elena'],
  ['ava', 'wei'],
];

/**
 * Loads the demo scenario once. Idempotent: when the organization exists nothing changes, so a
 * second `npm start` leaves the data (and the audit trail) as it was.
 */
export async function loadDemo(ds: DataSource, bcryptCost = 12): Promise<{ created: boolean; organizationId: string }> {
  const existing = await ds.getRepository(Organization).findOneBy({ name: DEMO_ORG_NAME });
  if (existing) return { created: false, organizationId: existing.id };
  const hash = await bcrypt.hash(DEMO_PASSWORD, bcryptCost);
  const organizationId = await ds.transaction(async (m: EntityManager) => {
    // Re-checked under a lock so two starts at once cannot both load the demo.
    await m.query(`SELECT pg_advisory_xact_lock(hashtextextended('loadline:demo', 0))`);
    const again = await m.findOneBy(Organization, { name: DEMO_ORG_NAME });
    if (again) return again.id;
    const org = await m.save(m.create(Organization, { name: DEMO_ORG_NAME, emergencyNumber: '911' }));
    const ids: Record<string, string> = {};
    for (const p of DEMO_PEOPLE) {
      const user = await m.save(m.create(User, { email: p.email, displayName: p.name, passwordHash: hash, unitPref: p.key === 'maya' ? 'lb' : 'kg' }));
      const membership = await m.save(m.create(Membership, { organizationId: org.id, userId: user.id, roles: p.roles, active: true }));
      ids[p.key] = membership.id;
      if (p.athlete) {
        await m.save(m.create(AthleteProfile, { id: membership.id, organizationId: org.id, ...p.athlete }));
      }
    }
    for (const [athlete, member, role] of CARE_TEAMS) {
      await m.save(m.create(CareTeamAssignment, { organizationId: org.id, athleteId: ids[athlete], memberId: ids[member], role }));
    }
    for (const [athlete, guardian] of GUARDIANS) {
      await m.save(m.create(GuardianLink, { organizationId: org.id, athleteId: ids[athlete], guardianId: ids[guardian] }));
    }
    await appendAudit(m, {
      organizationId: org.id,
      actorUserId: null,
      action: 'demo.loaded',
      subjectType: 'Organization',
      subjectId: org.id,
      after: { people: DEMO_PEOPLE.length, careTeamAssignments: CARE_TEAMS.length, guardianLinks: GUARDIANS.length },
    });
    return org.id;
  });
  return { created: true, organizationId };
}
