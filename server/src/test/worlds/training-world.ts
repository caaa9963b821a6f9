import { afterAll, beforeAll, expect } from 'vitest';
import { addDays } from '../../../../policies/today';
import { CareTeamAssignment, GuardianLink } from '../../entities';
import { signedIn, type Client, type Harness } from '../harness';
import { createMember, createOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../factories';
import { pinClock, unpinClock } from './clock-world';

export type Who = 'admin' | 'coach' | 'clinician' | 'athlete' | 'guardian' | 'otherAthlete' | 'otherCoach' | 'otherClinician';

export interface World {
  org: TestOrg;
  base: string;
  as: (who: Who) => Promise<Client>;
}

/** The training tests run at one pinned instant, in an organization on UTC. */
export const TODAY = '2026-06-10';
export const fromToday = (n: number) => addDays(TODAY, n);

export const logBody = (athleteId: string, over: Record<string, unknown> = {}) => ({
  athleteId,
  date: '2026-02-02',
  durationMinutes: 60,
  sessionRpe: 5,
  painBefore: 1,
  painDuring: 3,
  ...over,
});

export async function logSession(c: Client, w: World, body: Record<string, unknown>) {
  const res = await c.post(`${w.base}/training-logs`, body);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as {
    log: { id: string; version: number; painCeiling: number; sessionLoad: number };
    painRule: { action: string; flags: { kind: string }[]; athleteMessage: string };
  };
}

/** Helpers of one test file, bound to its harness; pins the clock for the file. */
export function trainingWorld(h: Harness) {
  beforeAll(() => pinClock(`${TODAY}T12:00:00Z`));
  afterAll(unpinClock);

  /** One organization for the file; a second care team (otherCoach + otherClinician around otherAthlete). */
  async function makeWorld(): Promise<World> {
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
  let worldOnce: Promise<World> | null = null;
  const world = () => (worldOnce ??= makeWorld());

  /** An athlete of their own on the same care team and guardian, signed in: for tests that read the athlete's whole history. */
  async function freshAthlete(w: World): Promise<{ ref: MemberRef; client: Client }> {
    const ref = await createMember(h.ds, w.org.id, ['athlete'], { dateOfBirth: '2010-03-14' });
    await h.ds.getRepository(CareTeamAssignment).save([
      { organizationId: w.org.id, athleteId: ref.membershipId, memberId: w.org.coach.membershipId, role: 'coach' },
      { organizationId: w.org.id, athleteId: ref.membershipId, memberId: w.org.clinician.membershipId, role: 'clinician' },
    ]);
    await h.ds
      .getRepository(GuardianLink)
      .save({ organizationId: w.org.id, athleteId: ref.membershipId, guardianId: w.org.guardian.membershipId });
    return { ref, client: await signedIn(h.app, ref.email, TEST_PASSWORD) };
  }

  async function noticesAbout(athleteId: string): Promise<Record<string, string[]>> {
    const rows: { recipient_id: string; kind: string }[] = await h.ds.query(
      'SELECT recipient_id, kind FROM notifications WHERE athlete_id = $1 ORDER BY kind',
      [athleteId],
    );
    const out: Record<string, string[]> = {};
    for (const r of rows) (out[r.recipient_id] ??= []).push(r.kind);
    return out;
  }
  const flagsFrom = async (logId: string): Promise<{ kind: string; severity: string; suggested_action: string | null }[]> =>
    h.ds.query('SELECT kind, severity, suggested_action FROM flags WHERE source_id = $1', [logId]);
  const logsOf = async (athleteId: string): Promise<number> =>
    Number((await h.ds.query('SELECT count(*) FROM training_logs WHERE athlete_id = $1', [athleteId]))[0].count);

  return { world, freshAthlete, noticesAbout, flagsFrom, logsOf };
}
