import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, expect } from 'vitest';
import { CareTeamAssignment } from '../../entities';
import { signedIn, type Client, type Harness } from '../harness';
import { createMember, createOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../factories';
import { pinClock, unpinClock } from './clock-world';

export type Who = 'admin' | 'coach' | 'clinician' | 'clinician2' | 'athlete' | 'guardian' | 'otherCoach' | 'otherClinician';

export interface World {
  org: TestOrg & { clinician2: MemberRef };
  base: string;
  as: (who: Who) => Promise<Client>;
}

export const put = (c: Client, path: string, body: object) => c.agent.put(path).set('x-csrf-token', c.csrf).send(body);

/** Stage 1: 5–18 January 2026, stage 2: 25 January–7 February; a gap of six days between. */
export const twoStages = () => [
  {
    id: randomUUID(),
    label: 'Protect',
    startDate: '2026-01-05',
    endDate: '2026-01-18',
    painCeiling: 3,
    patterns: { hinge: { mode: 'capped', caps: { maxPercent1RM: 60, maxRpe: 7 } }, jump: { mode: 'blocked' } },
  },
  {
    id: randomUUID(),
    label: 'Build',
    startDate: '2026-01-25',
    endDate: '2026-02-07',
    patterns: {
      hinge: { mode: 'capped', caps: { maxPercent1RM: 80 } },
      jump: { mode: 'capped', caps: { impactAllowed: false, maxSetsPerSession: 3 } },
    },
  },
];

/** Helpers of one test file, bound to its harness. The plans' dates are fixed; the clock is pinned all the same. */
export function planWorld(h: Harness) {
  beforeAll(() => pinClock('2026-06-10T12:00:00Z'));
  afterAll(unpinClock);

  /**
   * One organization for the file (each sign-in costs a bcrypt comparison): the factory's care team
   * plus a second clinician on it, and a second care team (otherCoach + otherClinician around
   * otherAthlete), so "same role, other care team" is someone with athletes of their own.
   */
  async function makeWorld(): Promise<World> {
    const base = await createOrg(h.ds);
    const clinician2 = await createMember(h.ds, base.id, ['clinician']);
    await h.ds.getRepository(CareTeamAssignment).save([
      { organizationId: base.id, athleteId: base.athlete.membershipId, memberId: clinician2.membershipId, role: 'clinician' },
      { organizationId: base.id, athleteId: base.otherAthlete.membershipId, memberId: base.otherClinician.membershipId, role: 'clinician' },
      { organizationId: base.id, athleteId: base.otherAthlete.membershipId, memberId: base.otherCoach.membershipId, role: 'coach' },
    ]);
    const org = { ...base, clinician2 };
    const clients = new Map<Who, Promise<Client>>();
    const as = (who: Who) => {
      if (!clients.has(who)) clients.set(who, signedIn(h.app, (org[who] as MemberRef).email, TEST_PASSWORD));
      return clients.get(who)!;
    };
    return { org, base: `/api/orgs/${org.id}`, as };
  }
  let worldOnce: Promise<World> | null = null;
  const world = () => (worldOnce ??= makeWorld());

  /** An athlete of their own for a test that reads the athlete's whole picture (in-force). */
  async function freshAthlete(w: World): Promise<string> {
    const a = await createMember(h.ds, w.org.id, ['athlete'], { dateOfBirth: '2009-05-01' });
    await h.ds
      .getRepository(CareTeamAssignment)
      .save({ organizationId: w.org.id, athleteId: a.membershipId, memberId: w.org.clinician.membershipId, role: 'clinician' });
    return a.membershipId;
  }

  async function openCase(w: World, athleteId = w.org.athlete.membershipId): Promise<string> {
    const res = await (
      await w.as('clinician')
    ).post(`${w.base}/cases`, {
      athleteId,
      bodyRegions: ['lower_back'],
      onsetDate: '2026-01-02',
      diagnosis: 'Lumbar strain',
      status: 'limited',
      statusEffectiveFrom: '2026-01-03',
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body.id;
  }

  async function newPlan(w: World, caseId: string, stages = twoStages(), guidance = 'Keep the back happy') {
    const res = await (await w.as('clinician')).post(`${w.base}/cases/${caseId}/plan`, { stages, guidance });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return { id: res.body.id as string, stages, body: res.body };
  }

  const versionRows = async (planId: string): Promise<number[]> =>
    (await h.ds.query('SELECT version FROM restriction_plan_versions WHERE plan_id = $1 ORDER BY version', [planId])).map(
      (r: { version: number }) => r.version,
    );

  return { world, freshAthlete, openCase, newPlan, versionRows };
}
