import { afterAll, beforeAll } from 'vitest';
import type { BodyRegion } from '../../../../policies/body-regions';
import { noRedFlags, RED_FLAG_ITEMS } from '../../../../policies/red-flags';
import { addDays } from '../../../../policies/today';
import { CareTeamAssignment, GuardianLink, Membership, Organization } from '../../entities';
import { signedIn, type Client, type Harness } from '../harness';
import { createMember, createOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../factories';
import { pinClock, unpinClock } from './clock-world';

export type Who = 'admin' | 'coach' | 'clinician' | 'clinician2' | 'athlete' | 'guardian' | 'otherCoach' | 'otherClinician';

/** A local number unlike the factory's default '911', so the message provably uses the organization's own. */
export const EMERGENCY_NUMBER = '112';

export interface World {
  org: TestOrg & { clinician2: MemberRef; inactiveClinician: MemberRef };
  base: string;
  as: (who: Who) => Promise<Client>;
}

/** The pain-report tests run at one pinned instant, in an organization on UTC. */
export const TODAY = '2026-06-10';
export const fromToday = (n: number) => addDays(TODAY, n);

export const allNo = () => Object.fromEntries(RED_FLAG_ITEMS.map((i) => [i.id, false]));
export const question = (id: string) => RED_FLAG_ITEMS.find((i) => i.id === id)!.question;

/** A report on the lower back (or the places in `over.bodyRegions`), answering that screen No except the ids in `yes`. */
export const reportBody = (athleteId: string, over: Record<string, unknown> = {}, yes: string[] = []) => {
  const bodyRegions = (over.bodyRegions as BodyRegion[] | undefined) ?? ['lower_back'];
  return {
    athleteId,
    bodyRegions,
    painNow: 4,
    painWorst24h: 6,
    onsetDate: fromToday(-2),
    aggravatingPatterns: ['hinge'],
    startedInTraining: true,
    redFlags: { ...noRedFlags(bodyRegions), ...Object.fromEntries(yes.map((id) => [id, true])) },
    ...over,
  };
};

/** Helpers of one test file, bound to its harness; pins the clock for the file. */
export function reportWorld(h: Harness) {
  beforeAll(() => pinClock(`${TODAY}T12:00:00Z`));
  afterAll(unpinClock);

  /**
   * One organization for the file (sign-ins cost a bcrypt comparison each): the factory's care team plus
   * a second clinician and a deactivated clinician on it, and a second care team (otherCoach +
   * otherClinician around otherAthlete), so "same role, other care team" has athletes of its own.
   */
  async function makeWorld(): Promise<World> {
    const base = await createOrg(h.ds);
    await h.ds.getRepository(Organization).update({ id: base.id }, { emergencyNumber: EMERGENCY_NUMBER });
    const [clinician2, inactiveClinician] = await Promise.all([
      createMember(h.ds, base.id, ['clinician']),
      createMember(h.ds, base.id, ['clinician']),
    ]);
    await h.ds.getRepository(Membership).update({ id: inactiveClinician.membershipId }, { active: false });
    await h.ds.getRepository(CareTeamAssignment).save([
      { organizationId: base.id, athleteId: base.athlete.membershipId, memberId: clinician2.membershipId, role: 'clinician' },
      { organizationId: base.id, athleteId: base.otherAthlete.membershipId, memberId: base.otherClinician.membershipId, role: 'clinician' },
      { organizationId: base.id, athleteId: base.otherAthlete.membershipId, memberId: base.otherCoach.membershipId, role: 'coach' },
    ]);
    const org = { ...base, clinician2, inactiveClinician };
    const clients = new Map<Who, Promise<Client>>();
    const as = (who: Who) => {
      if (!clients.has(who)) clients.set(who, signedIn(h.app, (org[who] as MemberRef).email, TEST_PASSWORD));
      return clients.get(who)!;
    };
    return { org, base: `/api/orgs/${org.id}`, as };
  }
  let worldOnce: Promise<World> | null = null;
  const world = () => (worldOnce ??= makeWorld());

  /**
   * A minor athlete of their own, on the same care team (coach, clinician, clinician2, the deactivated
   * clinician) with the same guardian, signed in: for tests that count notices or read the status.
   */
  async function freshAthlete(w: World): Promise<{ ref: MemberRef; client: Client }> {
    const ref = await createMember(h.ds, w.org.id, ['athlete'], { dateOfBirth: '2010-03-14' });
    await h.ds.getRepository(CareTeamAssignment).save(
      [w.org.coach, w.org.clinician, w.org.clinician2, w.org.inactiveClinician].map((m, i) => ({
        organizationId: w.org.id,
        athleteId: ref.membershipId,
        memberId: m.membershipId,
        role: i === 0 ? ('coach' as const) : ('clinician' as const),
      })),
    );
    await h.ds
      .getRepository(GuardianLink)
      .save({ organizationId: w.org.id, athleteId: ref.membershipId, guardianId: w.org.guardian.membershipId });
    return { ref, client: await signedIn(h.app, ref.email, TEST_PASSWORD) };
  }

  /** Notices about an athlete, as { recipient membership id: [kinds] }. */
  async function noticesAbout(athleteId: string): Promise<Record<string, string[]>> {
    const rows: { recipient_id: string; kind: string }[] = await h.ds.query(
      'SELECT recipient_id, kind FROM notifications WHERE athlete_id = $1 ORDER BY kind',
      [athleteId],
    );
    const out: Record<string, string[]> = {};
    for (const r of rows) (out[r.recipient_id] ??= []).push(r.kind);
    return out;
  }
  const flagsAbout = async (athleteId: string): Promise<{ kind: string; severity: string; source_id: string; message: string }[]> =>
    h.ds.query('SELECT kind, severity, source_id, message FROM flags WHERE athlete_id = $1', [athleteId]);
  const casesOf = async (athleteId: string): Promise<{ id: string; opened_by: string | null }[]> =>
    h.ds.query('SELECT id, opened_by FROM cases WHERE athlete_id = $1', [athleteId]);
  const reportsOf = async (athleteId: string): Promise<number> =>
    Number((await h.ds.query('SELECT count(*) FROM pain_reports WHERE athlete_id = $1', [athleteId]))[0].count);

  return { world, freshAthlete, noticesAbout, flagsAbout, casesOf, reportsOf };
}
