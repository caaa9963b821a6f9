import { createHash, randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import { noRedFlags } from '../../../../policies/red-flags';
import { LETTER_CAUTION } from '../../../../templates/letter/clearance-letter';
import { useHarness } from '../../test/harness';
import type { MemberRef } from '../../test/factories';
import { binary, letterKit, oneLine, pdfText, pinClock, type Signed, type World } from '../../test/worlds/letter-fixtures';

/**
 * What a signed clearance letter's PDF says, and never says (it carries status and limits only, no
 * diagnosis or notes), and that its stored bytes and hash are the ones downloaded. This app runs
 * without a mail queue; e-mail is covered in mail/letter-mail.test.ts.
 */
const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { world, freshAthlete, draftLetter, signLetter, signedLetter, auditActions } = letterKit(h);
pinClock('12:00:00');

describe('the signed letter PDF', () => {
  const DIAGNOSIS = `Diagnosis ${randomUUID()}`;
  const NOTES = `Clinical notes ${randomUUID()}`;
  const STATUS_NOTE = `Status note ${randomUUID()}`;
  const PAIN_NOTE = `Pain narrative ${randomUUID()}`;
  let w: World;
  let athlete: MemberRef;
  let signed: Signed;
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
      onsetDate: '2026-01-12',
      aggravatingPatterns: ['squat'],
      startedInTraining: true,
      note: PAIN_NOTE,
      redFlags: noRedFlags(['knee_left']),
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
    const expected = [
      'Lifting things from the floor or bending forward at the hips: weights no heavier than three fifths of the most that can be lifted once; keep it at a moderate effort, able to do 3 more.',
      'No jumping or landing.',
    ];
    expect(draft.limits).toEqual(expected);
    const signed = await signLetter(w, draft);
    const text = await pdfText((await binary(clin.get(`${w.base}/letters/${signed.id}/pdf`))).body as Buffer);
    expect(text).toContain('Limited participation from 5 March 2026');
    expect(text).toContain('Valid until 20 March 2026');
    expect(text).toContain('Limits on training');
    for (const l of expected) expect(text).toContain(`• ${l}`);
    // The athlete's words, not the staff's: no "estimated 1RM" on a letter.
    expect(text).not.toContain('1RM');

    // A later start date picks up the later stage.
    const later = await draftLetter(w, athlete.membershipId, { decision: 'limited', effectiveFrom: '2026-03-25', validUntil: null });
    expect(later.limits).toEqual([
      'Lifting things from the floor or bending forward at the hips: weights no heavier than four fifths of the most that can be lifted once.',
    ]);
    // A full decision carries no limits, whatever is in force.
    const full = await draftLetter(w, athlete.membershipId, { decision: 'full', effectiveFrom: '2026-03-05' });
    expect(full.limits).toEqual([]);
  });
});
