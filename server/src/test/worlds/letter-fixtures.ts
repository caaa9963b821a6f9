import { afterAll, beforeAll, expect, vi } from 'vitest';
import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';
import type request from 'supertest';
import { addDays } from '../../../../policies/today';
import { CareTeamAssignment, GuardianLink } from '../../entities';
import { Client, signedIn, type Harness } from '../harness';
import { createMember, createOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../factories';

/**
 * Shared by the clearance-letter test files (one file per scenario): a world of people around two
 * athletes, letters drafted and signed over HTTP, the PDF's text, the public check and the trail.
 */

/**
 * Pins the clock (Date only) at `utcTime` on a day a year after the real one, for the whole file, and
 * answers that instant. A year ahead, so sessions and rate-limit rows made under it are never swept by
 * another test app that runs on the real clock; a fixed time of day, so the file passes at any hour.
 */
export function pinClock(utcTime: string): () => Date {
  const day = addDays(new Date().toISOString().slice(0, 10), 365);
  const at = new Date(`${day}T${utcTime}Z`);
  beforeAll(() => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(at);
  });
  afterAll(() => {
    vi.useRealTimers();
  });
  return () => at;
}

export type Who = 'coach' | 'clinician' | 'athlete' | 'guardian' | 'otherGuardian' | 'otherClinician' | 'otherAthlete';

export interface World {
  org: TestOrg;
  base: string;
  as: (who: Who) => Promise<Client>;
}

export const letterBody = (athleteId: string, over: Record<string, unknown> = {}) => ({
  athleteId,
  decision: 'full',
  effectiveFrom: '2026-03-02',
  validUntil: '2026-06-30',
  credential: 'ATC',
  licenceNumber: 'AT-12345',
  familyNote: 'Back to full training; build up over the first week.',
  ...over,
});

export type Signed = { id: string; verificationCode: string; pdfSha256: string; status: string; version: number };

/** supertest hands back a PDF as a Buffer only when asked to. */
export const binary = (r: request.Test) =>
  r.buffer(true).parse((res, done) => {
    const chunks: Buffer[] = [];
    res.on('data', (c: Buffer) => chunks.push(c));
    res.on('end', () => done(null, Buffer.concat(chunks)));
  });

export async function pdfText(bytes: Buffer): Promise<string> {
  const doc = await getDocument({ data: new Uint8Array(bytes), useSystemFonts: false, isEvalSupported: false }).promise;
  const parts: string[] = [];
  for (let n = 1; n <= doc.numPages; n++) {
    const content = await (await doc.getPage(n)).getTextContent();
    parts.push(content.items.map((i) => ('str' in i ? i.str + (i.hasEOL ? ' ' : '') : '')).join(''));
  }
  await doc.destroy();
  return parts.join(' ').replace(/\s+/g, ' ');
}

export const oneLine = (s: string) => s.replace(/\s+/g, ' ');

/** The helpers of one test file, bound to its app. */
export function letterKit(h: Harness) {
  /**
   * One organization for the file (sign-ins cost a bcrypt comparison each): the factory's care team,
   * plus a second circle around otherAthlete (otherClinician, and otherGuardian as that athlete's
   * guardian), so "same role, other athlete" is someone with an athlete of their own.
   */
  async function makeWorld(): Promise<World> {
    const org = await createOrg(h.ds);
    await h.ds.getRepository(CareTeamAssignment).save({
      organizationId: org.id,
      athleteId: org.otherAthlete.membershipId,
      memberId: org.otherClinician.membershipId,
      role: 'clinician',
    });
    await h.ds
      .getRepository(GuardianLink)
      .save({ organizationId: org.id, athleteId: org.otherAthlete.membershipId, guardianId: org.otherGuardian.membershipId });
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
   * An athlete of their own in the shared organization, with the same coach, clinician and guardian:
   * a later letter supersedes every earlier one for the athlete, so tests never share one.
   */
  async function freshAthlete(w: World, name?: string): Promise<MemberRef> {
    const a = await createMember(h.ds, w.org.id, ['athlete'], { dateOfBirth: '2010-06-01', name });
    await h.ds.getRepository(CareTeamAssignment).save([
      { organizationId: w.org.id, athleteId: a.membershipId, memberId: w.org.coach.membershipId, role: 'coach' },
      { organizationId: w.org.id, athleteId: a.membershipId, memberId: w.org.clinician.membershipId, role: 'clinician' },
    ]);
    await h.ds
      .getRepository(GuardianLink)
      .save({ organizationId: w.org.id, athleteId: a.membershipId, guardianId: w.org.guardian.membershipId });
    return a;
  }

  async function draftLetter(w: World, athleteId: string, over: Record<string, unknown> = {}) {
    const res = await (await w.as('clinician')).post(`${w.base}/letters`, letterBody(athleteId, over));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body as { id: string; version: number; limits: string[]; status: string };
  }

  async function signLetter(w: World, letter: { id: string; version: number }): Promise<Signed> {
    const res = await (
      await w.as('clinician')
    ).post(`${w.base}/letters/${letter.id}/sign`, { signature: w.org.clinician.name, version: letter.version });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    // Which letter replaces which goes by the signing instant: under a pinned clock, the next one is a second later.
    if (vi.isFakeTimers()) vi.setSystemTime(Date.now() + 1000);
    return res.body as Signed;
  }

  const signedLetter = async (w: World, athleteId: string, over: Record<string, unknown> = {}) =>
    signLetter(w, await draftLetter(w, athleteId, over));

  async function auditActions(
    subjectId: string,
  ): Promise<{ action: string; actor_user_id: string | null; organization_id: string; after: Record<string, unknown> | null }[]> {
    return h.ds.query(
      `SELECT action, actor_user_id, organization_id, after FROM audit_entries WHERE subject_type = 'Letter' AND subject_id = $1 ORDER BY id`,
      [subjectId],
    );
  }

  const check = async (code: string) => (await Client.anonymous(h.app)).post('/api/check', { code });

  return { world, freshAthlete, draftLetter, signLetter, signedLetter, auditActions, check };
}
