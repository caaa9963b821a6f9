import { afterAll, beforeAll, expect } from 'vitest';
import { addDays } from '../../../../policies/today';
import { CareTeamAssignment } from '../../entities';
import { signedIn, type Client, type Harness } from '../harness';
import { createMember, createOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../factories';
import { pinClock, unpinClock } from './clock-world';

export type Who = 'admin' | 'coach' | 'clinician' | 'athlete' | 'guardian' | 'otherCoach' | 'otherClinician';

export interface World {
  org: TestOrg;
  base: string;
  as: (who: Who) => Promise<Client>;
}

/**
 * The cases tests run at one pinned instant, in an organization on UTC: every "today" below is
 * TODAY, whatever the hour the suite runs at.
 */
export const TODAY = '2026-06-10';
const NOW = `${TODAY}T12:00:00Z`;

/** 'YYYY-MM-DD' n days from TODAY. */
export const fromToday = (n: number) => addDays(TODAY, n);

export const caseBody = (athleteId: string, over: Record<string, unknown> = {}) => ({
  athleteId,
  bodyRegions: ['lower_back'],
  onsetDate: fromToday(-20),
  diagnosis: 'Lumbar strain',
  clinicalNotes: 'Tender L4-L5 on palpation',
  status: 'limited',
  statusEffectiveFrom: fromToday(-19),
  statusNote: 'Light work only',
  reviewDate: fromToday(14),
  ...over,
});

/** Opens a case as the clinician, for the factory's athlete unless `over.athleteId` names another. */
export async function openCase(c: Client, w: World, over: Record<string, unknown> = {}): Promise<{ id: string; version: number }> {
  const res = await c.post(`${w.base}/cases`, caseBody(w.org.athlete.membershipId, over));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body;
}

/** Helpers of one test file, bound to its harness; pins the clock for the file. */
export function caseWorld(h: Harness) {
  beforeAll(() => pinClock(NOW));
  afterAll(unpinClock);

  /**
   * One organization with two care teams: the factory's (coach + clinician + guardian around the
   * minor athlete) and a second one (otherCoach + otherClinician around otherAthlete), so "same role,
   * other care team" is a real clinician or coach with athletes of their own (ASVS 5.0 V8.2.2).
   */
  async function world(): Promise<World> {
    const org = await createOrg(h.ds);
    await h.ds.getRepository(CareTeamAssignment).save([
      { organizationId: org.id, athleteId: org.otherAthlete.membershipId, memberId: org.otherClinician.membershipId, role: 'clinician' },
      { organizationId: org.id, athleteId: org.otherAthlete.membershipId, memberId: org.otherCoach.membershipId, role: 'coach' },
    ]);
    const clients = new Map<Who, Promise<Client>>();
    const as = (who: Who) => {
      if (!clients.has(who)) clients.set(who, signedIn(h.app, (org[who] as MemberRef).email, TEST_PASSWORD));
      return clients.get(who)!;
    };
    return { org, base: `/api/orgs/${org.id}`, as };
  }

  /**
   * Sign-ins cost a bcrypt comparison each (cost 12), so the file shares one organization and its
   * signed-in people; a test that looks at an athlete's whole picture (caseload, in-force, trail) gets
   * an athlete of its own on the same care team, so no test reads another's rows.
   */
  let sharedWorld: Promise<World> | null = null;
  const shared = () => (sharedWorld ??= world());

  async function freshAthlete(w: World): Promise<string> {
    const a = await createMember(h.ds, w.org.id, ['athlete'], { dateOfBirth: '2010-03-14' });
    await h.ds.getRepository(CareTeamAssignment).save([
      { organizationId: w.org.id, athleteId: a.membershipId, memberId: w.org.clinician.membershipId, role: 'clinician' },
      { organizationId: w.org.id, athleteId: a.membershipId, memberId: w.org.coach.membershipId, role: 'coach' },
    ]);
    return a.membershipId;
  }

  const caseRow = async (id: string) =>
    (
      await h.ds.query(
        'SELECT organization_id, athlete_id, diagnosis, clinical_notes, review_date::text, closed_on::text, version FROM cases WHERE id = $1',
        [id],
      )
    )[0];
  const casesOf = async (athleteId: string): Promise<number> =>
    Number((await h.ds.query('SELECT count(*) FROM cases WHERE athlete_id = $1', [athleteId]))[0].count);
  const statusRows = async (caseId: string): Promise<number> =>
    Number((await h.ds.query('SELECT count(*) FROM participation_status_changes WHERE case_id = $1', [caseId]))[0].count);

  return { world, shared, freshAthlete, caseRow, casesOf, statusRows };
}
