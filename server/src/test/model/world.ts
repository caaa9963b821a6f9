/**
 * The real side of the model-based test: one organization per run (its own time zone), its coach
 * and clinician signed in through the HTTP API, and the plain-SQL reads the invariant is checked on.
 */
import bcrypt from 'bcryptjs';
import { vi } from 'vitest';
import type { Response } from 'supertest';
import { CareTeamAssignment } from '../../entities';
import { createOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../factories';
import { signedIn, type Client, type Harness } from '../harness';
import type { Model } from './model';

export interface Real {
  h: Harness;
  org: TestOrg;
  base: string;
  coach: Client;
  clinician: Client;
}

/** The library exercises the model uses: their patterns are among PATTERNS; two name a reference lift. */
export const MODEL_EXERCISES = [
  'Deadlift',
  'Romanian deadlift',
  'Back squat',
  'Box squat',
  'Trap-bar deadlift',
  'Power clean',
  'Box jump',
] as const;

// The factories hash the password at cost 12 (a quarter second per sign-in); every run signs in again
// after each move of the clock, so the same password is stored at cost 4, as the route tests do.
let cheap: Promise<string> | null = null;

export async function signInStaff(r: Real): Promise<void> {
  r.coach = await signedIn(r.h.app, r.org.coach.email, TEST_PASSWORD);
  r.clinician = await signedIn(r.h.app, r.org.clinician.email, TEST_PASSWORD);
}

export async function setUp(h: Harness, zone: string, start: number, twoAthletes: boolean): Promise<{ model: Model; real: Real }> {
  vi.setSystemTime(new Date(start));
  const org = await createOrg(h.ds);
  const users = Object.values(org)
    .filter((v): v is MemberRef => typeof v === 'object')
    .map((m) => m.userId);
  await h.ds.query(`UPDATE users SET password_hash = $1 WHERE id = ANY($2)`, [await (cheap ??= bcrypt.hash(TEST_PASSWORD, 4)), users]);
  await h.ds.query(`UPDATE organizations SET time_zone = $1 WHERE id = $2`, [zone, org.id]);
  const athletes = [org.athlete.membershipId];
  if (twoAthletes) {
    athletes.push(org.otherAthlete.membershipId);
    await h.ds.getRepository(CareTeamAssignment).save(
      (['coach', 'clinician'] as const).map((role) => ({
        organizationId: org.id,
        athleteId: org.otherAthlete.membershipId,
        memberId: (role === 'coach' ? org.coach : org.clinician).membershipId,
        role,
      })),
    );
  }
  const real = { h, org, base: `/api/orgs/${org.id}` } as Real;
  await signInStaff(real);
  const library = (await call(real, 'coach', 'get', '/exercises')).body as {
    id: string;
    name: string;
    patterns: string[];
    ballistic: boolean;
    referenceId: string | null;
  }[];
  const exercises = MODEL_EXERCISES.map((name) => {
    const e = library.find((x) => x.name === name)!;
    return {
      id: e.id,
      name,
      patterns: e.patterns as Model['exercises'][number]['patterns'],
      ballistic: e.ballistic,
      referenceId: e.referenceId,
      archived: false,
    };
  });
  const groups = twoAthletes ? [[athletes[0]], [athletes[1]], athletes] : [athletes];
  const programs = [];
  for (const athleteIds of groups) {
    const res = await call(real, 'coach', 'post', '/programs', { name: `Block ${programs.length + 1}`, athleteIds });
    expectStatus(res, [201], 'create a program');
    programs.push({ id: res.body.id as string, athleteIds });
  }
  const model: Model = {
    zone,
    now: start,
    athletes,
    programs,
    exercises,
    baselines: [],
    cases: [],
    sessions: [],
    exceptions: [],
    seq: 0,
    log: [],
  };
  return { model, real };
}

export function call(r: Real, who: 'coach' | 'clinician', method: 'get' | 'post' | 'put' | 'patch', path: string, body?: object) {
  const c = r[who];
  const req = c.agent[method](`${r.base}${path}`);
  return method === 'get' ? req : req.set('x-csrf-token', c.csrf).send(body ?? {});
}

export function expectStatus(res: Response, allowed: number[], what: string): void {
  if (!allowed.includes(res.status))
    throw new Error(`${what}: HTTP ${res.status} (expected ${allowed.join(' or ')}) ${JSON.stringify(res.body)}`);
}

/** The row version the next write must name (read just before it, so the model need not track it). */
export async function versionOf(r: Real, table: 'cases' | 'restriction_plans' | 'program_sessions' | 'exercises', id: string) {
  const [row] = await r.h.ds.query(`SELECT version FROM ${table} WHERE id = $1`, [id]);
  return row.version as number;
}
