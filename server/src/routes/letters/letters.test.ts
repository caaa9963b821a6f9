import { createHash, randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';
import type request from 'supertest';
import { RED_FLAG_ITEMS } from '../../../../policies/red-flags';
import { todayIso } from '../../../../policies/roles';
import { LETTER_CAUTION } from '../../../../templates/letter/clearance-letter';
import { CareTeamAssignment, GuardianLink } from '../../entities';
import { hashCode, initials, newVerificationCode, normalizeCode } from '../../services/letters';
import { Client, signedIn, useHarness } from '../../test/harness';
import { createMember, createOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../../test/factories';

/**
 * Clearance letters over HTTP, on the real database: what the signed PDF says (and never says), who may
 * draft, sign, download and acknowledge, the public check page, and the audit trail.
 * E-mail delivery is covered in mail/deliveries.test.ts; this app runs without a mail queue.
 */
const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

type Who = 'coach' | 'clinician' | 'athlete' | 'guardian' | 'otherGuardian' | 'otherClinician' | 'otherAthlete';

interface World {
  org: TestOrg;
  base: string;
  as: (who: Who) => Promise<Client>;
}

/**
 * One organization for the file (sign-ins cost a bcrypt comparison each): the factory's care team,
 * plus a second circle around otherAthlete (otherClinician, and otherGuardian as that athlete's
 * guardian), so "same role, other athlete" is someone with an athlete of their own.
 */
async function makeWorld(): Promise<World> {
  const org = await createOrg(h.ds);
  await h.ds
    .getRepository(CareTeamAssignment)
    .save({
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

const letterBody = (athleteId: string, over: Record<string, unknown> = {}) => ({
  athleteId,
  decision: 'full',
  effectiveFrom: '2026-03-02',
  validUntil: '2026-06-30',
  credential: 'ATC',
  licenceNumber: 'AT-12345',
  familyNote: 'Back to full training; build up over the first week.',
  ...over,
});

async function draftLetter(w: World, athleteId: string, over: Record<string, unknown> = {}) {
  const res = await (await w.as('clinician')).post(`${w.base}/letters`, letterBody(athleteId, over));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as { id: string; version: number; limits: string[]; status: string };
}

async function signLetter(w: World, letter: { id: string; version: number }) {
  const res = await (
    await w.as('clinician')
  ).post(`${w.base}/letters/${letter.id}/sign`, { signature: w.org.clinician.name, version: letter.version });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as { id: string; verificationCode: string; pdfSha256: string; status: string; version: number };
}

async function signedLetter(w: World, athleteId: string, over: Record<string, unknown> = {}) {
  return signLetter(w, await draftLetter(w, athleteId, over));
}

/** supertest hands back a PDF as a Buffer only when asked to. */
const binary = (r: request.Test) =>
  r.buffer(true).parse((res, done) => {
    const chunks: Buffer[] = [];
    res.on('data', (c: Buffer) => chunks.push(c));
    res.on('end', () => done(null, Buffer.concat(chunks)));
  });

async function pdfText(bytes: Buffer): Promise<string> {
  const doc = await getDocument({ data: new Uint8Array(bytes), useSystemFonts: false, isEvalSupported: false }).promise;
  const parts: string[] = [];
  for (let n = 1; n <= doc.numPages; n++) {
    const content = await (await doc.getPage(n)).getTextContent();
    parts.push(content.items.map((i) => ('str' in i ? i.str + (i.hasEOL ? ' ' : '') : '')).join(''));
  }
  await doc.destroy();
  return parts.join(' ').replace(/\s+/g, ' ');
}

const oneLine = (s: string) => s.replace(/\s+/g, ' ');

async function auditActions(
  subjectId: string,
): Promise<{ action: string; actor_user_id: string | null; organization_id: string; after: Record<string, unknown> | null }[]> {
  return h.ds.query(
    `SELECT action, actor_user_id, organization_id, after FROM audit_entries WHERE subject_type = 'Letter' AND subject_id = $1 ORDER BY id`,
    [subjectId],
  );
}

const check = async (code: string) => (await Client.anonymous(h.app)).post('/api/check', { code });

describe('the signed letter PDF', () => {
  const DIAGNOSIS = `Diagnosis ${randomUUID()}`;
  const NOTES = `Clinical notes ${randomUUID()}`;
  const STATUS_NOTE = `Status note ${randomUUID()}`;
  const PAIN_NOTE = `Pain narrative ${randomUUID()}`;
  let w: World;
  let athlete: MemberRef;
  let signed: Awaited<ReturnType<typeof signLetter>>;
  let pdf: Buffer;
  let text: string;

  beforeAll(async () => {
    w = await world();
    athlete = w.org.athlete;
    // The athlete's file holds a case with a diagnosis and notes, and a pain report with a narrative:
    // none of it belongs on a letter that coaches, schools and the public check page see.
    const c = await (
      await w.as('clinician')
    ).post(`${w.base}/cases`, {
      athleteId: athlete.membershipId,
      bodyRegions: ['knee_left'],
      onsetDate: '2026-01-10',
      diagnosis: DIAGNOSIS,
      clinicalNotes: NOTES,
      status: 'limited',
      statusEffectiveFrom: '2026-01-11',
      statusNote: STATUS_NOTE,
    });
    expect(c.status, JSON.stringify(c.body)).toBe(201);
    const pain = await (
      await w.as('athlete')
    ).post(`${w.base}/pain-reports`, {
      athleteId: athlete.membershipId,
      bodyRegions: ['knee_left'],
      painNow: 3,
      painWorst24h: 5,
      onsetDate: todayIso(),
      aggravatingPatterns: ['squat'],
      startedInTraining: true,
      note: PAIN_NOTE,
      redFlags: Object.fromEntries(RED_FLAG_ITEMS.map((i) => [i.id, false])),
    });
    expect(pain.status, JSON.stringify(pain.body)).toBe(201);
    signed = await signedLetter(w, athlete.membershipId);
    const res = await binary((await w.as('clinician')).get(`${w.base}/letters/${signed.id}/pdf`));
    expect(res.status).toBe(200);
    pdf = res.body as Buffer;
    text = await pdfText(pdf);
  });

  it('holds the decision, its dates, the athlete, the signer, the verification code and check link, and the caution', () => {
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    for (const part of [
      'Clearance letter',
      athlete.name,
      'Full participation from 2 March 2026',
      'Valid until 30 June 2026 (next review).',
      'Back to full training; build up over the first week.',
      `${w.org.clinician.name}, ATC, licence AT-12345`,
      `Verification code: ${signed.verificationCode}`,
      `/check/${signed.verificationCode}`,
      oneLine(LETTER_CAUTION),
    ]) {
      expect(text, part).toContain(part);
    }
    expect(text).not.toContain('DRAFT');
  });

  it("holds none of the athlete's diagnosis, clinical notes, status note or pain narrative", () => {
    for (const secret of [DIAGNOSIS, NOTES, STATUS_NOTE, PAIN_NOTE]) expect(text).not.toContain(secret);
    expect(text).not.toMatch(/knee/i);
    // Nor in the raw file (document info, metadata or any uncompressed object).
    const raw = pdf.toString('latin1');
    for (const secret of [DIAGNOSIS, NOTES, STATUS_NOTE, PAIN_NOTE]) expect(raw).not.toContain(secret);
  });

  it('the stored SHA-256 is the hash of the bytes downloaded, and of the bytes stored', async () => {
    const sha = createHash('sha256').update(pdf).digest('hex');
    expect(signed.pdfSha256).toBe(sha);
    const [row] = await h.ds.query(`SELECT pdf, pdf_sha256 FROM clearance_letters WHERE id = $1`, [signed.id]);
    expect(row.pdf_sha256).toBe(sha);
    expect(Buffer.compare(row.pdf, pdf)).toBe(0);
    // Downloaded again by someone else: the same frozen bytes, never re-rendered.
    const again = await binary((await w.as('guardian')).get(`${w.base}/letters/${signed.id}/pdf`));
    expect(
      createHash('sha256')
        .update(again.body as Buffer)
        .digest('hex'),
    ).toBe(sha);
  });

  it('the athlete downloads their own letter (and may not acknowledge it); another athlete gets 404', async () => {
    const me = await w.as('athlete');
    const mine = await binary(me.get(`${w.base}/letters/${signed.id}/pdf`));
    expect(mine.status).toBe(200);
    expect(
      createHash('sha256')
        .update(mine.body as Buffer)
        .digest('hex'),
    ).toBe(signed.pdfSha256);
    expect((await me.post(`${w.base}/letters/${signed.id}/acknowledge`)).status).toBe(403);
    const other = await w.as('otherAthlete');
    expect((await other.get(`${w.base}/letters/${signed.id}/pdf`)).status).toBe(404);
    expect((await other.get(`${w.base}/letters`)).body).toEqual([]);
  });

  it('is sent as an attachment, never cached', async () => {
    const res = await binary((await w.as('guardian')).get(`${w.base}/letters/${signed.id}/pdf`));
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    expect(res.headers['content-disposition']).toBe('attachment; filename="clearance-letter-2026-03-02.pdf"');
    expect(res.headers['cache-control']).toBe('no-store');
  });

  it('the verification code is shown once: only its hash is kept, and no later response or audit entry carries it', async () => {
    expect(signed.verificationCode).toMatch(/^[0-9A-HJKMNP-TV-Z]{4}(-[0-9A-HJKMNP-TV-Z]{4}){4}$/);
    const [row] = await h.ds.query(`SELECT to_jsonb(l) - 'pdf' AS r FROM clearance_letters l WHERE id = $1`, [signed.id]);
    expect(row.r.code_hash).toBe(createHash('sha256').update(signed.verificationCode.replace(/-/g, '')).digest('hex'));
    expect(JSON.stringify(row.r)).not.toContain(signed.verificationCode);
    expect(JSON.stringify(row.r)).not.toContain(signed.verificationCode.replace(/-/g, ''));
    const list = await (await w.as('clinician')).get(`${w.base}/letters?athleteId=${athlete.membershipId}`);
    expect(list.body[0].id).toBe(signed.id);
    expect(list.body[0]).not.toHaveProperty('verificationCode');
    expect(JSON.stringify(list.body)).not.toContain(signed.verificationCode);
    expect(JSON.stringify(await auditActions(signed.id))).not.toContain(signed.verificationCode.replace(/-/g, '').slice(0, 8));
  });
});

describe('a limited letter', () => {
  it('lists the limits in force on its start date, in the plain words athletes and families read', async () => {
    const w = await world();
    const athlete = await freshAthlete(w);
    const clin = await w.as('clinician');
    const c = await clin.post(`${w.base}/cases`, {
      athleteId: athlete.membershipId,
      bodyRegions: ['lower_back'],
      onsetDate: '2026-02-20',
      status: 'limited',
      statusEffectiveFrom: '2026-02-21',
    });
    expect(c.status, JSON.stringify(c.body)).toBe(201);
    const plan = await clin.post(`${w.base}/cases/${c.body.id}/plan`, {
      guidance: 'Easy does it',
      stages: [
        {
          id: randomUUID(),
          label: 'Protect',
          startDate: '2026-03-01',
          endDate: '2026-03-20',
          painCeiling: 3,
          patterns: { hinge: { mode: 'capped', caps: { maxPercent1RM: 60, maxRpe: 7 } }, jump: { mode: 'blocked' } },
        },
        {
          id: randomUUID(),
          label: 'Build',
          startDate: '2026-03-21',
          endDate: '2026-04-10',
          patterns: { hinge: { mode: 'capped', caps: { maxPercent1RM: 80 } } },
        },
      ],
    });
    expect(plan.status, JSON.stringify(plan.body)).toBe(201);

    const draft = await draftLetter(w, athlete.membershipId, {
      decision: 'limited',
      effectiveFrom: '2026-03-05',
      validUntil: '2026-03-20',
    });
    const expected = ['Hinge: up to 60% of your best lift, effort RPE 7 or easier', 'Jump / landing: not allowed for now'];
    expect(draft.limits).toEqual(expected);
    const signed = await signLetter(w, draft);
    const text = await pdfText((await binary(clin.get(`${w.base}/letters/${signed.id}/pdf`))).body as Buffer);
    expect(text).toContain('Limited participation from 5 March 2026');
    expect(text).toContain('Valid until 20 March 2026');
    expect(text).toContain('Limits in force');
    for (const l of expected) expect(text).toContain(`• ${l}`);
    // The athlete's words, not the staff's: no "estimated 1RM" on a letter.
    expect(text).not.toContain('1RM');

    // A later start date picks up the later stage.
    const later = await draftLetter(w, athlete.membershipId, { decision: 'limited', effectiveFrom: '2026-03-25', validUntil: null });
    expect(later.limits).toEqual(['Hinge: up to 80% of your best lift']);
    // A full decision carries no limits, whatever is in force.
    const full = await draftLetter(w, athlete.membershipId, { decision: 'full', effectiveFrom: '2026-03-05' });
    expect(full.limits).toEqual([]);
  });
});

describe('drafts, edits and signing', () => {
  it('a draft can be edited; a signed letter is frozen (409) and cannot be signed twice', async () => {
    const w = await world();
    const athlete = await freshAthlete(w);
    const clin = await w.as('clinician');
    const draft = await draftLetter(w, athlete.membershipId, { validUntil: null });
    const edited = await clin.patch(`${w.base}/letters/${draft.id}`, { familyNote: 'Edited note.', version: draft.version });
    expect(edited.status, JSON.stringify(edited.body)).toBe(200);
    expect(edited.body).toMatchObject({ familyNote: 'Edited note.', status: 'draft' });
    expect(edited.body.version).toBeGreaterThan(draft.version);
    const signed = await signLetter(w, edited.body);
    expect(signed.status).toBe('signed');

    const frozen = await clin.patch(`${w.base}/letters/${draft.id}`, { familyNote: 'Too late.', version: signed.version });
    expect(frozen.status).toBe(409);
    expect(frozen.body.error.code).toBe('conflict');
    const twice = await clin.post(`${w.base}/letters/${draft.id}/sign`, { signature: 'Again', version: signed.version });
    expect(twice.status).toBe(409);
    const [row] = await h.ds.query(`SELECT family_note, signature, pdf_sha256 FROM clearance_letters WHERE id = $1`, [draft.id]);
    expect(row).toEqual({ family_note: 'Edited note.', signature: w.org.clinician.name, pdf_sha256: signed.pdfSha256 });
  });

  it('signing a version someone has since changed → 409, and nothing is signed', async () => {
    const w = await world();
    const athlete = await freshAthlete(w);
    const clin = await w.as('clinician');
    const draft = await draftLetter(w, athlete.membershipId);
    const edited = await clin.patch(`${w.base}/letters/${draft.id}`, { validUntil: '2026-05-01', version: draft.version });
    expect(edited.status).toBe(200);
    const stale = await clin.post(`${w.base}/letters/${draft.id}/sign`, { signature: w.org.clinician.name, version: draft.version });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('version_conflict');
    const [row] = await h.ds.query(`SELECT status, code_hash, pdf IS NULL AS no_pdf FROM clearance_letters WHERE id = $1`, [draft.id]);
    expect(row).toEqual({ status: 'draft', code_hash: null, no_pdf: true });
    // A stale edit is refused the same way.
    const staleEdit = await clin.patch(`${w.base}/letters/${draft.id}`, { familyNote: 'x', version: draft.version });
    expect(staleEdit.status).toBe(409);
  });

  it('the preview is the draft marked DRAFT with no code; only the clinicians who may sign get it', async () => {
    const w = await world();
    const athlete = await freshAthlete(w);
    const draft = await draftLetter(w, athlete.membershipId);
    const res = await binary((await w.as('clinician')).get(`${w.base}/letters/${draft.id}/preview`));
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toMatch(/^attachment;/);
    expect(res.headers['cache-control']).toBe('no-store');
    const text = await pdfText(res.body as Buffer);
    expect(text).toContain('DRAFT — not signed, not valid');
    expect(text).toContain('Full participation from 2 March 2026');
    expect(text).not.toContain('Verification code');
    expect(text).not.toContain('/check/');
    expect((await (await w.as('coach')).get(`${w.base}/letters/${draft.id}/preview`)).status).toBe(403);
    expect((await (await w.as('guardian')).get(`${w.base}/letters/${draft.id}/preview`)).status).toBe(403);
    expect((await (await w.as('otherClinician')).get(`${w.base}/letters/${draft.id}/preview`)).status).toBe(404);
    // A draft has no PDF to download yet.
    expect((await (await w.as('clinician')).get(`${w.base}/letters/${draft.id}/pdf`)).status).toBe(404);
  });

  it("a draft is the clinicians' working copy: the athlete, guardian and coach do not see it until it is signed", async () => {
    const w = await world();
    const athlete = w.org.athlete;
    const draft = await draftLetter(w, athlete.membershipId, { effectiveFrom: '2026-03-20', validUntil: null });
    const viewers: [string, Client][] = [
      ['athlete', await w.as('athlete')],
      ['guardian', await w.as('guardian')],
      ['coach', await w.as('coach')],
    ];
    const ids = async (c: Client) => {
      const list = await c.get(`${w.base}/letters?athleteId=${athlete.membershipId}`);
      expect(list.status).toBe(200);
      return list.body.map((l: { id: string; status: string }) => `${l.id} ${l.status}`);
    };
    for (const [who, c] of viewers) expect(await ids(c), who).not.toContain(`${draft.id} draft`);
    expect(await ids(await w.as('clinician'))).toContain(`${draft.id} draft`);
    await signLetter(w, draft);
    for (const [who, c] of viewers) expect(await ids(c), who).toContain(`${draft.id} signed`);
  });

  it("a new letter supersedes the athlete's earlier signed letter", async () => {
    const w = await world();
    const athlete = await freshAthlete(w);
    const other = await freshAthlete(w);
    const first = await signedLetter(w, athlete.membershipId);
    const theirs = await signedLetter(w, other.membershipId);
    const second = await signedLetter(w, athlete.membershipId, { effectiveFrom: '2026-04-01', validUntil: null });
    const list = await (await w.as('clinician')).get(`${w.base}/letters?athleteId=${athlete.membershipId}`);
    const byId = Object.fromEntries(list.body.map((l: { id: string }) => [l.id, l]));
    expect(byId[first.id]).toMatchObject({ status: 'superseded', supersededBy: second.id });
    expect(byId[second.id]).toMatchObject({ status: 'signed', supersededBy: null });
    const signedAudit = (await auditActions(second.id)).find((a) => a.action === 'letter.signed');
    expect(signedAudit?.after).toMatchObject({ supersedes: [first.id], pdfSha256: second.pdfSha256 });
    // Another athlete's letter is untouched.
    const [row] = await h.ds.query(`SELECT status FROM clearance_letters WHERE id = $1`, [theirs.id]);
    expect(row.status).toBe('signed');
  });
});

/** `days` after (or before) a YYYY-MM-DD date, in UTC like the server's "today". */
const plusDays = (iso: string, days: number) => new Date(Date.parse(`${iso}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10);

describe('a letter signed to start later', () => {
  it('leaves the earlier letter in force until its start date, then takes over (list and public check)', async () => {
    const w = await world();
    const athlete = await freshAthlete(w);
    const today = todayIso();
    const a = await signedLetter(w, athlete.membershipId, { effectiveFrom: today, validUntil: null });
    const b = await signedLetter(w, athlete.membershipId, { effectiveFrom: plusDays(today, 7), validUntil: null });
    const standings = async () => {
      const list = await (await w.as('guardian')).get(`${w.base}/letters?athleteId=${athlete.membershipId}`);
      expect(list.status).toBe(200);
      return Object.fromEntries(
        list.body.map((l: { id: string; status: string; supersededBy: string | null }) => [
          l.id,
          { status: l.status, supersededBy: l.supersededBy },
        ]),
      );
    };

    // B is signed and sent but has not started: A is still the letter in force.
    expect(b.status).toBe('scheduled');
    expect(await standings()).toEqual({
      [a.id]: { status: 'signed', supersededBy: null },
      [b.id]: { status: 'scheduled', supersededBy: null },
    });
    expect((await check(a.verificationCode)).body.status).toBe('valid');
    expect((await check(b.verificationCode)).body).toMatchObject({ status: 'scheduled', effectiveFrom: plusDays(today, 7) });
    // Signing still records who replaces whom, in the row and in the audit entry.
    const [row] = await h.ds.query(`SELECT superseded_by FROM clearance_letters WHERE id = $1`, [a.id]);
    expect(row.superseded_by).toBe(b.id);
    expect((await auditActions(b.id)).find((e) => e.action === 'letter.signed')?.after).toMatchObject({ supersedes: [a.id] });

    // A week on (both start dates moved back instead): B has started, so A is superseded.
    await h.ds.query(`UPDATE clearance_letters SET effective_from = effective_from - 8 WHERE id = ANY($1)`, [[a.id, b.id]]);
    expect(await standings()).toEqual({
      [a.id]: { status: 'superseded', supersededBy: b.id },
      [b.id]: { status: 'signed', supersededBy: null },
    });
    expect((await check(a.verificationCode)).body.status).toBe('superseded');
    expect((await check(b.verificationCode)).body.status).toBe('valid');
  });

  it('a letter signed afterwards that starts sooner replaces the scheduled one; the latest-signed letter that has started is in force', async () => {
    const w = await world();
    const athlete = await freshAthlete(w);
    const today = todayIso();
    const a = await signedLetter(w, athlete.membershipId, { effectiveFrom: plusDays(today, -30), validUntil: null });
    const b = await signedLetter(w, athlete.membershipId, { effectiveFrom: plusDays(today, 10), validUntil: null });
    const c = await signedLetter(w, athlete.membershipId, { effectiveFrom: today, validUntil: null });
    const list = await (await w.as('clinician')).get(`${w.base}/letters?athleteId=${athlete.membershipId}`);
    const byId = Object.fromEntries(list.body.map((l: { id: string }) => [l.id, l]));
    expect(byId[a.id]).toMatchObject({ status: 'superseded', supersededBy: c.id });
    expect(byId[b.id]).toMatchObject({ status: 'superseded', supersededBy: c.id });
    expect(byId[c.id]).toMatchObject({ status: 'signed', supersededBy: null });
    expect((await check(b.verificationCode)).body.status).toBe('superseded');
    expect((await check(c.verificationCode)).body.status).toBe('valid');
  });
});

describe('a letter past its valid-until day', () => {
  it('lists as expired and checks expired; the day itself is still in force; a superseded one stays superseded', async () => {
    const w = await world();
    const athlete = await freshAthlete(w);
    const today = todayIso();
    const old = await signedLetter(w, athlete.membershipId, { effectiveFrom: plusDays(today, -60), validUntil: plusDays(today, -40) });
    const a = await signedLetter(w, athlete.membershipId, { effectiveFrom: plusDays(today, -30), validUntil: today });
    const standings = async () => {
      const list = await (await w.as('guardian')).get(`${w.base}/letters?athleteId=${athlete.membershipId}`);
      expect(list.status).toBe(200);
      return Object.fromEntries(list.body.map((l: { id: string; status: string }) => [l.id, l.status]));
    };

    // Valid until today: still in force today.
    expect(await standings()).toEqual({ [old.id]: 'superseded', [a.id]: 'signed' });
    expect((await check(a.verificationCode)).body.status).toBe('valid');

    await h.ds.query(`UPDATE clearance_letters SET valid_until = $2 WHERE id = $1`, [a.id, plusDays(today, -1)]);
    expect(await standings()).toEqual({ [old.id]: 'superseded', [a.id]: 'expired' });
    expect((await check(a.verificationCode)).body).toMatchObject({ status: 'expired', validUntil: plusDays(today, -1) });
    expect((await check(old.verificationCode)).body.status).toBe('superseded');
  });
});

describe('who may do what with a letter', () => {
  let w: World;
  let athlete: MemberRef;
  let letter: Awaited<ReturnType<typeof signLetter>>;
  beforeAll(async () => {
    w = await world();
    athlete = await freshAthlete(w);
    letter = await signedLetter(w, athlete.membershipId);
  });

  it('a guardian of another athlete: the letter is not in their list, and it and its PDF answer 404', async () => {
    const g = await w.as('otherGuardian');
    const list = await g.get(`${w.base}/letters`);
    expect(list.status).toBe(200);
    expect(list.body.map((l: { id: string }) => l.id)).not.toContain(letter.id);
    expect((await g.get(`${w.base}/letters?athleteId=${athlete.membershipId}`)).body).toEqual([]);
    const pdf = await g.get(`${w.base}/letters/${letter.id}/pdf`);
    expect(pdf.status).toBe(404);
    expect(pdf.headers['content-type']).toMatch(/json/);
    expect((await g.post(`${w.base}/letters/${letter.id}/acknowledge`)).status).toBe(404);
  });

  it('a clinician of another athlete can neither see, edit, sign nor download it (404), nor draft one for this athlete', async () => {
    const c = await w.as('otherClinician');
    expect((await c.get(`${w.base}/letters/${letter.id}/pdf`)).status).toBe(404);
    const draft = await draftLetter(w, athlete.membershipId);
    expect((await c.patch(`${w.base}/letters/${draft.id}`, { familyNote: 'x', version: draft.version })).status).toBe(404);
    expect((await c.post(`${w.base}/letters/${draft.id}/sign`, { signature: 'x', version: draft.version })).status).toBe(404);
    const before = Number(
      (await h.ds.query(`SELECT count(*) FROM clearance_letters WHERE athlete_id = $1`, [athlete.membershipId]))[0].count,
    );
    const created = await c.post(`${w.base}/letters`, letterBody(athlete.membershipId));
    expect([403, 404]).toContain(created.status);
    expect(
      Number((await h.ds.query(`SELECT count(*) FROM clearance_letters WHERE athlete_id = $1`, [athlete.membershipId]))[0].count),
    ).toBe(before);
  });

  it('the coach reads the letter (without who it was sent to) but cannot draft, edit or sign (403)', async () => {
    const coach = await w.as('coach');
    const list = await coach.get(`${w.base}/letters?athleteId=${athlete.membershipId}`);
    expect(list.body).toHaveLength(1);
    expect(list.body[0]).not.toHaveProperty('deliveries');
    const clinicianView = await (await w.as('clinician')).get(`${w.base}/letters?athleteId=${athlete.membershipId}`);
    expect(clinicianView.body[0]).toHaveProperty('deliveries');
    const draft = await draftLetter(w, athlete.membershipId, { effectiveFrom: '2026-03-03' });
    const sign = await coach.post(`${w.base}/letters/${draft.id}/sign`, { signature: w.org.coach.name, version: draft.version });
    expect(sign.status).toBe(403);
    expect(sign.body.error.code).toBe('forbidden');
    expect((await coach.patch(`${w.base}/letters/${draft.id}`, { familyNote: 'x', version: draft.version })).status).toBe(403);
    expect((await coach.post(`${w.base}/letters`, letterBody(athlete.membershipId))).status).toBe(403);
    const [row] = await h.ds.query(`SELECT status FROM clearance_letters WHERE id = $1`, [draft.id]);
    expect(row.status).toBe('draft');
    // The coach may download the signed letter itself (it carries no clinical detail).
    expect((await coach.get(`${w.base}/letters/${letter.id}/pdf`)).status).toBe(200);
  });

  it('signed out → 401; another organization → 404 through its own address and through this one', async () => {
    const anon = await Client.anonymous(h.app);
    expect((await anon.get(`${w.base}/letters/${letter.id}/pdf`)).status).toBe(401);
    expect((await anon.get(`${w.base}/letters`)).status).toBe(401);
    const orgB = await createOrg(h.ds);
    const theirClinician = await signedIn(h.app, orgB.clinician.email, TEST_PASSWORD);
    expect((await theirClinician.get(`/api/orgs/${orgB.id}/letters/${letter.id}/pdf`)).status).toBe(404);
    expect((await theirClinician.post(`/api/orgs/${orgB.id}/letters/${letter.id}/acknowledge`)).status).toBe(403);
    // Not a member here: the organization's letters are not even acknowledged to exist.
    expect((await theirClinician.get(`${w.base}/letters/${letter.id}/pdf`)).status).toBe(404);
    expect((await theirClinician.get(`${w.base}/letters`)).status).toBe(404);
    const theirList = await theirClinician.get(`/api/orgs/${orgB.id}/letters`);
    expect(theirList.status).toBe(200);
    expect(theirList.body).toEqual([]);
  });

  it('fields a clinician may not set are refused, not quietly applied', async () => {
    const clin = await w.as('clinician');
    const draft = await draftLetter(w, athlete.membershipId, { effectiveFrom: '2026-03-04' });
    for (const body of [
      { status: 'signed', version: draft.version },
      { organizationId: randomUUID(), version: draft.version },
      { athleteId: w.org.otherAthlete.membershipId, version: draft.version },
      { pdfSha256: 'a'.repeat(64), version: draft.version },
    ]) {
      const res = await clin.patch(`${w.base}/letters/${draft.id}`, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
    }
    const [row] = await h.ds.query(`SELECT status, athlete_id, organization_id FROM clearance_letters WHERE id = $1`, [draft.id]);
    expect(row).toEqual({ status: 'draft', athlete_id: athlete.membershipId, organization_id: w.org.id });
  });
});

describe('acknowledgement and the audit trail', () => {
  it('the guardian acknowledges once: time-stamped, audited once, and a second call adds nothing', async () => {
    const w = await world();
    const athlete = await freshAthlete(w);
    const letter = await signedLetter(w, athlete.membershipId);
    const g = await w.as('guardian');
    const before = Date.now();
    const first = await g.post(`${w.base}/letters/${letter.id}/acknowledge`);
    expect(first.status, JSON.stringify(first.body)).toBe(200);
    expect(first.body.acknowledgements).toHaveLength(1);
    const ack = first.body.acknowledgements[0];
    expect(ack).toMatchObject({ guardianId: w.org.guardian.membershipId, guardianName: w.org.guardian.name });
    const at = Date.parse(ack.acknowledgedAt);
    expect(at).toBeGreaterThanOrEqual(before - 5_000);
    expect(at).toBeLessThanOrEqual(Date.now() + 5_000);

    const second = await g.post(`${w.base}/letters/${letter.id}/acknowledge`);
    expect(second.status).toBe(200);
    expect(second.body.acknowledgements).toEqual([ack]);
    expect(Number((await h.ds.query(`SELECT count(*) FROM letter_acknowledgements WHERE letter_id = $1`, [letter.id]))[0].count)).toBe(1);
    const acks = (await auditActions(letter.id)).filter((a) => a.action === 'letter.acknowledged');
    expect(acks).toHaveLength(1);
    expect(acks[0].actor_user_id).toBe(w.org.guardian.userId);

    // The clinician sees who acknowledged, and when.
    const seen = await (await w.as('clinician')).get(`${w.base}/letters?athleteId=${athlete.membershipId}`);
    expect(seen.body[0].acknowledgements).toEqual([ack]);
  });

  it('the trail records letter.drafted, letter.signed, each letter.downloaded and letter.acknowledged, with the actor', async () => {
    const w = await world();
    const athlete = await freshAthlete(w);
    const letter = await signedLetter(w, athlete.membershipId);
    await (await w.as('guardian')).get(`${w.base}/letters/${letter.id}/pdf`);
    await (await w.as('coach')).get(`${w.base}/letters/${letter.id}/pdf`);
    await (await w.as('guardian')).post(`${w.base}/letters/${letter.id}/acknowledge`);
    const trail = await auditActions(letter.id);
    expect(trail.map((a) => a.action)).toEqual([
      'letter.drafted',
      'letter.signed',
      'letter.downloaded',
      'letter.downloaded',
      'letter.acknowledged',
    ]);
    expect(trail.map((a) => a.actor_user_id)).toEqual([
      w.org.clinician.userId,
      w.org.clinician.userId,
      w.org.guardian.userId,
      w.org.coach.userId,
      w.org.guardian.userId,
    ]);
    expect(new Set(trail.map((a) => a.organization_id))).toEqual(new Set([w.org.id]));
    // A refused download is not recorded as one.
    await (await w.as('otherGuardian')).get(`${w.base}/letters/${letter.id}/pdf`);
    expect((await auditActions(letter.id)).filter((a) => a.action === 'letter.downloaded')).toHaveLength(2);
  });

  it('a draft cannot be acknowledged (404), and only guardians acknowledge (coach 403)', async () => {
    const w = await world();
    const athlete = await freshAthlete(w);
    const draft = await draftLetter(w, athlete.membershipId);
    expect((await (await w.as('guardian')).post(`${w.base}/letters/${draft.id}/acknowledge`)).status).toBe(404);
    const signed = await signLetter(w, draft);
    expect((await (await w.as('coach')).post(`${w.base}/letters/${signed.id}/acknowledge`)).status).toBe(403);
    expect((await (await w.as('clinician')).post(`${w.base}/letters/${signed.id}/acknowledge`)).status).toBe(403);
    expect(Number((await h.ds.query(`SELECT count(*) FROM letter_acknowledgements WHERE letter_id = $1`, [signed.id]))[0].count)).toBe(0);
  });
});

describe('the public check page', () => {
  const NOTES = `Check notes ${randomUUID()}`;
  const DIAGNOSIS = `Check diagnosis ${randomUUID()}`;
  const PAIN = `Check pain ${randomUUID()}`;
  let w: World;
  let athlete: MemberRef;
  let first: Awaited<ReturnType<typeof signLetter>>;
  // Its review is still ahead, so the letter is in force whenever the test runs.
  const until = plusDays(todayIso(), 60);
  beforeAll(async () => {
    w = await world();
    athlete = await freshAthlete(w, 'Maya Lindqvist-Ortega');
    const c = await (
      await w.as('clinician')
    ).post(`${w.base}/cases`, {
      athleteId: athlete.membershipId,
      bodyRegions: ['lower_leg_left'],
      onsetDate: '2026-01-10',
      diagnosis: DIAGNOSIS,
      clinicalNotes: NOTES,
      status: 'limited',
      statusEffectiveFrom: '2026-01-11',
      statusNote: PAIN,
    });
    expect(c.status, JSON.stringify(c.body)).toBe(201);
    first = await signedLetter(w, athlete.membershipId, {
      decision: 'limited',
      limits: ['Sprint: not allowed for now'],
      effectiveFrom: '2026-03-09',
      validUntil: until,
    });
  });

  it('a signed letter checks valid, with initials, decision, dates, organization and issue date only', async () => {
    const res = await check(first.verificationCode);
    expect(res.status).toBe(200);
    expect(res.headers['cache-control']).toMatch(/no-store/);
    const [org] = await h.ds.query(`SELECT name FROM organizations WHERE id = $1`, [w.org.id]);
    const [{ signed_at: signedAt }] = await h.ds.query(`SELECT signed_at FROM clearance_letters WHERE id = $1`, [first.id]);
    expect(res.body).toEqual({
      status: 'valid',
      athleteInitials: initials(athlete.name),
      decision: 'Limited participation from 9 March 2026',
      effectiveFrom: '2026-03-09',
      validUntil: until,
      organizationName: org.name,
      issuedOn: (signedAt as Date).toISOString().slice(0, 10),
    });
    expect(res.body.athleteInitials).toBe('M. L.');
  });

  it("never holds the athlete's name, notes, diagnosis, pain data or limits", async () => {
    const body = JSON.stringify((await check(first.verificationCode)).body);
    for (const word of athlete.name.split(' ')) expect(body).not.toContain(word);
    for (const secret of [NOTES, DIAGNOSIS, PAIN, 'lower_leg', 'Lower leg', 'Sprint', w.org.clinician.name, athlete.membershipId, first.id])
      expect(body).not.toContain(secret);
  });

  it('takes the code as people type it: lower case, without dashes, with spaces, O for 0 and I or L for 1', async () => {
    const typed = first.verificationCode.toLowerCase().replace(/-/g, '');
    expect((await check(typed)).body.status).toBe('valid');
    expect((await check(first.verificationCode.replace(/-/g, ' '))).body.status).toBe('valid');
    // Look-alikes, on a letter whose code is known to hold 0s and 1s.
    const lookAlike = await signedLetter(w, (await freshAthlete(w)).membershipId, { validUntil: null });
    await h.ds.query(`UPDATE clearance_letters SET code_hash = $2 WHERE id = $1`, [lookAlike.id, hashCode('0A1B-0C1D-00EF-11GH-0101')]);
    expect((await check('oa1b-OcId-ooef-lLgh-oIoL')).body.status).toBe('valid');
    expect((await check('oa1b-OcId-ooef-lLgh-oIoM')).body.status).toBe('unknown');
  });

  it('after a second letter, the first checks superseded and the second valid', async () => {
    const second = await signedLetter(w, athlete.membershipId, { decision: 'full', effectiveFrom: '2026-04-10', validUntil: null });
    expect((await check(first.verificationCode)).body).toMatchObject({
      status: 'superseded',
      decision: 'Limited participation from 9 March 2026',
    });
    expect((await check(second.verificationCode)).body).toMatchObject({
      status: 'valid',
      decision: 'Full participation from 10 April 2026',
      validUntil: null,
    });
  });

  it('a code never issued is unknown, with nothing else; a malformed one is refused (400)', async () => {
    const unknown = await check(newVerificationCode());
    expect(unknown.status).toBe(200);
    expect(unknown.body).toEqual({ status: 'unknown' });
    const bad = await check('<script>alert(1)</script>');
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('validation_failed');
  });
});

describe('verification codes', () => {
  it('are 100 random bits: 20 Crockford base32 characters in five groups of four, never repeating', () => {
    const seen = new Set<string>();
    const used = new Set<string>();
    for (let i = 0; i < 2000; i++) {
      const code = newVerificationCode();
      expect(code).toMatch(/^[0-9A-HJKMNP-TV-Z]{4}(-[0-9A-HJKMNP-TV-Z]{4}){4}$/);
      seen.add(code);
      for (const ch of code.replace(/-/g, '')) used.add(ch);
    }
    expect(seen.size).toBe(2000);
    // All 32 symbols turn up: no bit is stuck.
    expect(used.size).toBe(32);
  });

  it('normalize the way people type them back', () => {
    expect(normalizeCode('abcd-efgh-jkmn-pqrs-tvwx')).toBe('ABCDEFGHJKMNPQRSTVWX');
    expect(normalizeCode(' o0Oi-IlL1 ')).toBe('00011111');
    expect(hashCode('0A1B-0C1D')).toBe(hashCode('oa ib oc ld'));
    expect(hashCode('0A1B-0C1D')).not.toBe(hashCode('0A1B-0C1E'));
  });
});

describe('the check endpoint is rate-limited per address', () => {
  // An app of its own, so the other tests' checks do not count against this window.
  const rl = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

  it('30 checks in a minute answer; the 31st → 429, and a forged X-Forwarded-For does not reset it', async () => {
    const anon = await Client.anonymous(rl.app);
    for (let i = 0; i < 30; i++) {
      const res = await anon.post('/api/check', { code: newVerificationCode() });
      expect(res.status, `check ${i + 1}`).toBe(200);
    }
    const over = await anon.post('/api/check', { code: newVerificationCode() });
    expect(over.status).toBe(429);
    expect(over.body.error.code).toBe('rate_limited');
    const fresh = await Client.anonymous(rl.app);
    const forged = await fresh.agent
      .post('/api/check')
      .set('x-csrf-token', fresh.csrf)
      .set('x-forwarded-for', '203.0.113.9')
      .send({ code: newVerificationCode() });
    expect(forged.status).toBe(429);
  });
});
