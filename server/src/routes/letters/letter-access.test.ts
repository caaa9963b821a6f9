import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import { Client, signedIn, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD, type MemberRef } from '../../test/factories';
import { letterBody, letterKit, pinClock, type Signed, type World } from '../../test/worlds/letter-fixtures';

/**
 * Who may draft, sign, download and acknowledge a letter: a record of another care team or
 * organization answers 404 (ASVS 5.0 V8.2.2), a role that may read but not write answers 403; and the
 * audit trail of each step, with its actor.
 */
const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { world, freshAthlete, draftLetter, signLetter, signedLetter, auditActions } = letterKit(h);
pinClock('12:00:00');

describe('who may do what with a letter', () => {
  let w: World;
  let athlete: MemberRef;
  let letter: Signed;
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
    // The clock is pinned: the acknowledgement carries the instant it was made.
    const at = new Date().toISOString();
    const first = await g.post(`${w.base}/letters/${letter.id}/acknowledge`);
    expect(first.status, JSON.stringify(first.body)).toBe(200);
    expect(first.body.acknowledgements).toHaveLength(1);
    const ack = first.body.acknowledgements[0];
    expect(ack).toMatchObject({ guardianId: w.org.guardian.membershipId, guardianName: w.org.guardian.name });
    expect(ack.acknowledgedAt).toBe(at);

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
