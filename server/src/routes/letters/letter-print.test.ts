import { describe, expect, it } from 'vitest';
import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';
import { orgToday } from '../../../../policies/today';
import { TEST_PASSWORD } from '../../test/factories';
import { signedIn, useHarness } from '../../test/harness';
import { binary, letterKit, pdfText, pinClock, type World } from '../../test/worlds/letter-fixtures';

/**
 * What the signed letter prints besides its decision: the organization's paper, its clock, the
 * athlete's date of birth, and the signer's credential, licence and contact once each. The clock is
 * pinned at 12:00 UTC; this file's organization moves to America/Chicago (UTC−6 in December, UTC−5 in
 * summer), so the test reads the local time through Intl rather than assuming either.
 */
const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { world, freshAthlete, signedLetter } = letterKit(h);
const now = pinClock('12:00:00');

const admin = (w: World) => signedIn(h.app, w.org.admin.email, TEST_PASSWORD);

async function settings(w: World, change: Record<string, unknown>) {
  const [{ version }] = await h.ds.query(`SELECT version FROM organizations WHERE id = $1`, [w.org.id]);
  const res = await (await admin(w)).patch(`${w.base}/settings`, { ...change, version });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as { letterPaper: string | null; letterPaperInUse: string };
}

/** The first page's MediaBox in PDF points (1/72 in), as a viewer reads it. */
async function mediaBox(pdf: Buffer): Promise<number[]> {
  const doc = await getDocument({ data: new Uint8Array(pdf), useSystemFonts: false, isEvalSupported: false }).promise;
  const view = (await doc.getPage(1)).view;
  await doc.destroy();
  return view.map((v) => Math.round(v * 100) / 100);
}

async function signedPdf(w: World, over: Record<string, unknown> = {}) {
  const athlete = await freshAthlete(w);
  const signed = await signedLetter(w, athlete.membershipId, { effectiveFrom: orgToday('UTC', now()), validUntil: null, ...over });
  const res = await binary((await w.as('clinician')).get(`${w.base}/letters/${signed.id}/pdf`));
  expect(res.status).toBe(200);
  return { pdf: res.body as Buffer, athlete, code: signed.verificationCode };
}

describe('the paper (ISO 216 A4 = 595.28 × 841.89 pt; ANSI Letter = 612 × 792 pt)', () => {
  it('follows the time zone’s country until the admin chooses, then the choice; a recorded country over the zone', async () => {
    const w = await world();
    // UTC is no country's zone: A4.
    expect(await settings(w, { timeZone: 'UTC' })).toMatchObject({ letterPaper: null, letterPaperInUse: 'a4' });
    expect(await mediaBox((await signedPdf(w)).pdf)).toEqual([0, 0, 595.28, 841.89]);
    // A United States zone: Letter.
    expect(await settings(w, { timeZone: 'America/Chicago' })).toMatchObject({ letterPaper: null, letterPaperInUse: 'letter' });
    expect(await mediaBox((await signedPdf(w)).pdf)).toEqual([0, 0, 612, 792]);
    // The admin's choice wins over the country.
    expect(await settings(w, { letterPaper: 'a4' })).toMatchObject({ letterPaper: 'a4', letterPaperInUse: 'a4' });
    expect(await mediaBox((await signedPdf(w)).pdf)).toEqual([0, 0, 595.28, 841.89]);
    expect(await settings(w, { letterPaper: null })).toMatchObject({ letterPaper: null, letterPaperInUse: 'letter' });
    // A recorded country decides over the time zone's: a German organization keeps a Chicago clock but prints on A4.
    expect(await settings(w, { country: 'DE' })).toMatchObject({ letterPaper: null, letterPaperInUse: 'a4' });
    expect(await mediaBox((await signedPdf(w)).pdf)).toEqual([0, 0, 595.28, 841.89]);
  });

  it('refuses a paper that is neither, naming the field', async () => {
    const w = await world();
    const res = await (await admin(w)).patch(`${w.base}/settings`, { letterPaper: 'legal', version: 1 });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('letterPaper');
  });
});

describe('what the signed letter prints', () => {
  it('the signing time on the organization’s clock, not UTC', async () => {
    const w = await world();
    await settings(w, { timeZone: 'America/Chicago' });
    const text = await pdfText((await signedPdf(w)).pdf);
    const local = new Intl.DateTimeFormat('en-GB', {
      timeZone: 'America/Chicago',
      hour: '2-digit',
      minute: '2-digit',
      hourCycle: 'h23',
    }).format(now());
    expect(local).not.toBe('12:00');
    expect(text).toContain(`${local} (America/Chicago time)`);
    expect(text).not.toContain('UTC');
  });

  it("the athlete's date of birth, and the credential, licence and contact once each when the name already carries the credential", async () => {
    const w = await world();
    // The display name carries "ATC"; the form's example reads "Physiotherapist, PT", so people type "Athletic trainer, ATC".
    await h.ds.query(`UPDATE users SET display_name = display_name || ', ATC' WHERE id = (SELECT user_id FROM memberships WHERE id = $1)`, [
      w.org.clinician.membershipId,
    ]);
    const { pdf, code } = await signedPdf(w, { credential: 'Athletic trainer, ATC', licenceNumber: 'AT-777' });
    // The random verification code could hold the letters ATC by chance: left out of the count.
    const text = (await pdfText(pdf)).replaceAll(code, '');
    expect(text).toContain('Born 1 June 2010');
    expect(text).toContain(`${w.org.clinician.name}, ATC, Athletic trainer, licence AT-777`);
    const count = (s: string) => text.split(s).length - 1;
    expect(count('ATC')).toBe(1);
    expect(count('AT-777')).toBe(1);
    expect(count(w.org.clinician.email)).toBe(1);
  });
});
