import { beforeAll, describe, expect, it } from 'vitest';
import { EMAIL_CAUTION } from '../../../templates/email/layout';
import { EMAIL_QUEUE } from '../jobs/queue';
import { binary, pdfText } from '../test/worlds/letter-fixtures';
import { useHarness, type Harness } from '../test/harness';
import { createOrg, type TestOrg } from '../test/factories';
import { createTransport, deliver } from './deliveries';
import { deliveriesWhere, letterMailTo, logger, mailTo, signLetter, waitFor, type DeliveryRow } from './mail-fixtures';

/**
 * A signed letter's e-mails through the durable queue: the real fake SMTP server, the real pg-boss
 * queue and worker, the real database. The letter row and its jobs commit together (the
 * transactional outbox), each recipient gets exactly one message, and every link comes from the
 * configuration, never from the request.
 */
const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' }, { mail: true });
let org: TestOrg;
beforeAll(async () => {
  org = await createOrg(h.ds);
});

describe('a signed letter', () => {
  let letter: Awaited<ReturnType<typeof signLetter>>;
  let rows: DeliveryRow[];
  beforeAll(async () => {
    letter = await signLetter(h.app, org);
    rows = await waitFor('every delivery of the letter sent', async () => {
      const r = await deliveriesWhere(h.ds, 'letter_id = $1', [letter.id]);
      return r.length > 0 && r.every((d) => d.status === 'sent') ? r : null;
    });
  });

  it('reaches the guardian, the athlete and the coach: exactly one message each, the signed PDF attached', async () => {
    const recipients = [org.guardian.email, org.athlete.email, org.coach.email];
    const mail = await letterMailTo(h.ds, recipients);
    expect(mail.map((m) => m.envelope_to).sort()).toEqual(recipients.map((r) => [r]).sort());
    for (const m of mail) {
      expect(m.subject).toBe(`Clearance letter for ${org.athlete.name}`);
      expect(m.attachments).toEqual([
        {
          filename: 'clearance-letter-2026-12-01.pdf',
          contentType: 'application/pdf',
          size: expect.any(Number),
          sha256: letter.pdfSha256,
        },
      ]);
      expect(m.text_body).toContain('Full participation from 1 December 2026');
      expect(m.text_body).toContain(EMAIL_CAUTION);
      expect(m.html_body).toContain(EMAIL_CAUTION);
    }
    // Nobody else: not the clinician who signed, not the admin, not another athlete's people.
    const others = [org.clinician.email, org.admin.email, org.otherGuardian.email, org.otherAthlete.email, org.otherCoach.email];
    expect(await mailTo(h.ds, others)).toEqual([]);
  });

  it("each delivery row ends 'sent' after one attempt, its body cleared, its message id recorded", async () => {
    expect(rows.map((r) => r.to_address).sort()).toEqual([org.guardian.email, org.athlete.email, org.coach.email].sort());
    for (const r of rows) {
      expect(r).toMatchObject({
        kind: 'letter',
        status: 'sent',
        attempts: 1,
        last_error: null,
        body_text: null,
        body_html: null,
        message_id: `<${r.id}@loadline.invalid>`,
      });
      expect(r.sent_at).toBeInstanceOf(Date);
    }
    const mail = await letterMailTo(
      h.ds,
      rows.map((r) => r.to_address),
    );
    expect(mail.map((m) => m.message_id).sort()).toEqual(rows.map((r) => `<${r.id}@loadline.invalid>`).sort());
    // The clinician sees the same in the letter's delivery list.
    const list = await letter.clin.get(`/api/orgs/${org.id}/letters?athleteId=${org.athlete.membershipId}`);
    const dto = list.body.find((l: { id: string }) => l.id === letter.id);
    expect(dto.deliveries.map((d: { status: string }) => d.status)).toEqual(['sent', 'sent', 'sent']);
  });

  it('a job run again for a delivery already sent sends nothing more, whether run directly or through the queue', async () => {
    const transport = createTransport(h.smtp!.url);
    for (const r of rows) await deliver(h.ds, transport, logger, r.id);
    const again = await h.jobs!.boss.send(EMAIL_QUEUE, { deliveryId: rows[0].id });
    expect(again).toBeTruthy();
    await waitFor('the repeated job to finish', async () => (await h.jobs!.boss.getJobById(EMAIL_QUEUE, again!))?.state === 'completed');
    expect(
      await letterMailTo(
        h.ds,
        rows.map((r) => r.to_address),
      ),
    ).toHaveLength(3);
    expect((await deliveriesWhere(h.ds, 'letter_id = $1', [letter.id])).map((r) => [r.status, r.attempts])).toEqual(
      rows.map(() => ['sent', 1]),
    );
  });
});

/**
 * Links in e-mails and letters are built from configuration, never from the request's Host header,
 * which the sender controls (OWASP WSTG-INPV-17, host header injection; "password reset
 * poisoning"): a signing request for another host is refused before the handler, and the letter
 * signed afterwards carries the configured base only.
 */
function forgedHostSigning(harness: Harness, base: () => string) {
  const FORGED = 'attacker.example';
  let theirs: TestOrg;
  let letter: Awaited<ReturnType<typeof signLetter>>;
  beforeAll(async () => {
    theirs = await createOrg(harness.ds);
    letter = await signLetter(harness.app, theirs, { forgedHost: FORGED });
    await waitFor('every delivery of the letter sent', async () => {
      const r = await deliveriesWhere(harness.ds, 'letter_id = $1', [letter.id]);
      return r.length === 3 && r.every((d) => d.status === 'sent');
    });
  });

  it('the refused request sent nothing: one e-mail per recipient, each linking to the configured base only', async () => {
    const mail = await letterMailTo(harness.ds, [theirs.guardian.email, theirs.athlete.email, theirs.coach.email]);
    expect(mail).toHaveLength(3);
    for (const m of mail) {
      expect(m.text_body).toContain(`${base()}/`);
      expect(m.html_body).toContain(`href="${base()}/"`);
      expect(`${m.text_body} ${m.html_body}`).not.toContain(FORGED);
    }
  });

  it("puts the configured base in the PDF's check link", async () => {
    const res = await binary(letter.clin.get(`/api/orgs/${theirs.id}/letters/${letter.id}/pdf`));
    expect(res.status).toBe(200);
    const text = await pdfText(res.body as Buffer);
    expect(text).toContain(`${base()}/check/${letter.verificationCode}`);
    expect(text).not.toContain(FORGED);
  });
}

describe('a letter signed through a request with a forged Host header, without PUBLIC_URL', () => {
  // The configured server's own address (HOST and PORT), as the server knows it.
  forgedHostSigning(h, () => `http://${h.config.HOST}:${h.config.PORT}`);
});

describe('a letter signed through a request with a forged Host header, with PUBLIC_URL', () => {
  const PUBLIC_URL = 'https://loadline.example.org';
  const withUrl = useHarness({ SIGNIN_MAX_PER_IP: '1000', PUBLIC_URL: `${PUBLIC_URL}/` }, { mail: true });
  forgedHostSigning(withUrl, () => PUBLIC_URL);
});
