import net from 'node:net';
import { expect } from 'vitest';
import pino from 'pino';
import type { DataSource } from 'typeorm';
import type { Express } from 'express';
import { emails } from '../../../templates/email/messages';
import { EMAIL_QUEUE } from '../jobs/queue';
import { signedIn } from '../test/harness';
import { TEST_PASSWORD, type TestOrg } from '../test/factories';
import type { EnqueueInput } from './deliveries';

/** Shared by the e-mail test files: the fake mailbox, the delivery rows and jobs, and a letter signed over HTTP. */
export const logger = pino({ level: 'silent' });

/** Polls until `fn` answers something truthy; fails the test after `ms`. */
export async function waitFor<T>(what: string, fn: () => Promise<T | null | undefined | false>, ms = 20_000): Promise<T> {
  const end = Date.now() + ms;
  for (;;) {
    const v = await fn();
    if (v) return v;
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

export interface MailRow {
  envelope_to: string[];
  subject: string | null;
  message_id: string | null;
  text_body: string | null;
  html_body: string | null;
  attachments: { filename: string; contentType: string; size: number; sha256: string }[];
}
export const mailTo = (db: DataSource, addresses: string[]): Promise<MailRow[]> =>
  db.query(
    `SELECT envelope_to, subject, message_id, text_body, html_body, attachments FROM fake_mailbox WHERE envelope_to && $1 ORDER BY id`,
    [addresses],
  );
export const letterMailTo = async (db: DataSource, addresses: string[]) =>
  (await mailTo(db, addresses)).filter((m) => m.subject?.startsWith('Clearance letter for '));

export interface DeliveryRow {
  id: string;
  to_address: string;
  kind: string;
  status: string;
  attempts: number;
  last_error: string | null;
  body_text: string | null;
  body_html: string | null;
  sent_at: Date | null;
  message_id: string | null;
}
export const deliveriesWhere = (db: DataSource, where: string, params: unknown[]): Promise<DeliveryRow[]> =>
  db.query(
    `SELECT id, to_address, kind, status, attempts, last_error, body_text, body_html, sent_at, message_id FROM email_deliveries WHERE ${where} ORDER BY to_address`,
    params,
  );

export const jobsFor = async (db: DataSource, deliveryIds: string[]): Promise<{ state: string; delivery_id: string }[]> =>
  db.query(`SELECT state, data->>'deliveryId' AS delivery_id FROM pgboss.job WHERE name = $1 AND data->>'deliveryId' = ANY($2)`, [
    EMAIL_QUEUE,
    deliveryIds,
  ]);

/**
 * A letter drafted and signed over HTTP by the organization's clinician. `forgedHost` first sends
 * the signing request with that Host header, as a forged request would, and expects it refused.
 */
export async function signLetter(app: Express, org: TestOrg, opts: { forgedHost?: string } = {}) {
  const c = await signedIn(app, org.clinician.email, TEST_PASSWORD);
  const base = `/api/orgs/${org.id}`;
  const draft = await c.post(`${base}/letters`, {
    athleteId: org.athlete.membershipId,
    decision: 'full',
    effectiveFrom: '2026-12-01',
    validUntil: '2027-03-01',
    credential: 'ATC',
    licenceNumber: 'AT-1',
    familyNote: '',
  });
  expect(draft.status, JSON.stringify(draft.body)).toBe(201);
  const body = { signature: org.clinician.name, version: draft.body.version };
  if (opts.forgedHost) {
    const forged = await c.agent
      .post(`${base}/letters/${draft.body.id}/sign`)
      .set('x-csrf-token', c.csrf)
      .set('Host', opts.forgedHost)
      .send(body);
    expect(forged.status, JSON.stringify(forged.body)).toBe(400);
    expect(forged.body.error.fields).toHaveProperty('host');
  }
  const signed = await c.post(`${base}/letters/${draft.body.id}/sign`, body);
  expect(signed.status, JSON.stringify(signed.body)).toBe(200);
  return {
    id: signed.body.id as string,
    pdfSha256: signed.body.pdfSha256 as string,
    verificationCode: signed.body.verificationCode as string,
    clin: c,
  };
}

/** A port nothing listens on: an SMTP server that is down. */
export async function closedPort(): Promise<number> {
  const server = net.createServer();
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
  const { port } = server.address() as net.AddressInfo;
  await new Promise<void>((r) => server.close(() => r()));
  return port;
}

export const sample = (to: string, over: Partial<EnqueueInput> = {}): EnqueueInput => ({
  organizationId: null,
  kind: 'test',
  to,
  content: emails.notice(),
  ...over,
});
