import { describe, expect, it } from 'vitest';
import { useHarness, signedIn } from '../../test/harness';
import { createOrg, TEST_PASSWORD } from '../../test/factories';

async function waitFor<T>(fn: () => Promise<T | null | undefined | false>, ms = 20_000): Promise<T> {
  const end = Date.now() + ms;
  for (;;) {
    const v = await fn();
    if (v) return v;
    if (Date.now() > end) throw new Error('timed out waiting');
    await new Promise((r) => setTimeout(r, 200));
  }
}

describe('letters smoke', () => {
  const h = useHarness({}, { mail: true });
  it('clinician drafts and signs; guardian, athlete and coach get one e-mail each with the PDF; check page; guardian acknowledges', async () => {
    const org = await createOrg(h.ds);
    const base = `/api/orgs/${org.id}`;
    const clin = await signedIn(h.app, org.clinician.email, TEST_PASSWORD);
    const draft = await clin.post(`${base}/letters`, { athleteId: org.athlete.membershipId, decision: 'full', effectiveFrom: '2026-12-01', validUntil: '2027-03-01', credential: 'ATC', licenceNumber: 'AT-12345', familyNote: 'All clear.' });
    expect(draft.status, JSON.stringify(draft.body)).toBe(201);
    const preview = await clin.get(`${base}/letters/${draft.body.id}/preview`);
    expect(preview.status).toBe(200);
    expect(preview.headers['content-type']).toBe('application/pdf');
    const signed = await clin.post(`${base}/letters/${draft.body.id}/sign`, { signature: 'Test Clinician', version: draft.body.version });
    expect(signed.status, JSON.stringify(signed.body)).toBe(200);
    const code = signed.body.verificationCode as string;
    expect(code).toMatch(/^[0-9A-Z]{4}(-[0-9A-Z]{4}){4}$/);
    const rows = await waitFor(async () => {
      const r: { envelope_to: string[]; attachments: { contentType: string }[] }[] = await h.ds.query(`SELECT envelope_to, attachments FROM fake_mailbox WHERE envelope_to && $1`, [[org.guardian.email, org.athlete.email, org.coach.email]]);
      return r.length >= 3 ? r : null;
    });
    expect(rows.map((r) => r.envelope_to[0]).sort()).toEqual([org.guardian.email, org.athlete.email, org.coach.email].sort());
    expect(rows.every((r) => r.attachments.some((a) => a.contentType === 'application/pdf'))).toBe(true);
    const anon = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    const check = await anon.post('/api/check', { code: code.toLowerCase() });
    expect(check.body).toMatchObject({ status: 'valid', decision: 'Full participation from 1 December 2026' });
    const g = await signedIn(h.app, org.guardian.email, TEST_PASSWORD);
    const pdf = await g.get(`${base}/letters/${draft.body.id}/pdf`);
    expect(pdf.headers['content-disposition']).toMatch(/^attachment/);
    expect(pdf.headers['cache-control']).toBe('no-store');
    const ack = await g.post(`${base}/letters/${draft.body.id}/acknowledge`);
    expect(ack.status, JSON.stringify(ack.body)).toBe(200);
    expect(ack.body.acknowledgements).toHaveLength(1);
    const second = await clin.post(`${base}/letters`, { athleteId: org.athlete.membershipId, decision: 'full', effectiveFrom: '2026-12-02', credential: 'ATC', licenceNumber: 'AT-12345' });
    await clin.post(`${base}/letters/${second.body.id}/sign`, { signature: 'Test Clinician', version: second.body.version });
    const again = await anon.post('/api/check', { code });
    expect(again.body.status).toBe('superseded');
    const unknown = await anon.post('/api/check', { code: 'AAAA-AAAA-AAAA-AAAA-AAAA' });
    expect(unknown.body).toEqual({ status: 'unknown' });
  });
});
