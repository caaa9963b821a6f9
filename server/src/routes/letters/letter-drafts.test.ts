import { describe, expect, it } from 'vitest';
import { CareTeamAssignment } from '../../entities';
import { signedIn, useHarness, type Client } from '../../test/harness';
import { createMember, TEST_PASSWORD } from '../../test/factories';
import { binary, letterKit, pdfText, pinClock } from '../../test/worlds/letter-fixtures';

/** A draft is the clinicians' working copy; signing freezes it and supersedes the athlete's earlier letter. */
const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { world, freshAthlete, draftLetter, signLetter, signedLetter, auditActions } = letterKit(h);
pinClock('12:00:00');

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

  it('the letter names the clinician who signs it, also when another clinician of the team drafted it', async () => {
    const w = await world();
    const athlete = await freshAthlete(w);
    const colleague = await createMember(h.ds, w.org.id, ['clinician']);
    await h.ds
      .getRepository(CareTeamAssignment)
      .save({ organizationId: w.org.id, athleteId: athlete.membershipId, memberId: colleague.membershipId, role: 'clinician' });
    const draft = await draftLetter(w, athlete.membershipId);
    const signer = await signedIn(h.app, colleague.email, TEST_PASSWORD);
    const res = await signer.post(`${w.base}/letters/${draft.id}/sign`, { signature: colleague.name, version: draft.version });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.clinicianName).toBe(colleague.name);
    const text = await pdfText((await binary(signer.get(`${w.base}/letters/${draft.id}/pdf`))).body as Buffer);
    expect(text).toContain(`${colleague.name}, ATC, licence AT-12345`);
    expect(text).not.toContain(w.org.clinician.name);
  });
});
