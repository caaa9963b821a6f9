import nodemailer, { type Transporter } from 'nodemailer';
import type { DataSource, EntityManager } from 'typeorm';
import type { Logger } from 'pino';
import { renderEmail, type EmailContent } from '../../../templates/email/layout';
import { ClearanceLetter, EmailDelivery } from '../entities';
import type { JobQueue } from '../jobs/queue';

export const MAIL_FROM = 'Loadline <no-reply@loadline.invalid>';

export interface EnqueueInput {
  organizationId: string | null;
  kind: string;
  to: string;
  recipientId?: string | null;
  content: EmailContent;
  letterId?: string | null;
}

/** CR and LF never reach a header: addresses and subjects are refused if they carry them. */
function assertHeaderSafe(...values: string[]) {
  for (const v of values) if (/[\r\n]/.test(v)) throw new Error('line break in an e-mail header field');
}

/**
 * Records one e-mail and its job in the caller's transaction: both commit with the change that
 * caused them, or neither does. Without a queue (a process that sends no mail) nothing is recorded.
 */
export async function enqueueEmail(m: EntityManager, queue: JobQueue | null, input: EnqueueInput): Promise<string | null> {
  if (!queue) return null;
  const rendered = renderEmail(input.content);
  assertHeaderSafe(input.to, rendered.subject);
  const row = await m.save(
    m.create(EmailDelivery, {
      organizationId: input.organizationId,
      kind: input.kind,
      toAddress: input.to,
      recipientId: input.recipientId ?? null,
      subject: rendered.subject.slice(0, 200),
      bodyText: rendered.text,
      bodyHtml: rendered.html,
      letterId: input.letterId ?? null,
      status: 'queued',
    }),
  );
  await queue.sendEmail(m, row.id);
  return row.id;
}

/**
 * The SMTP transport. `pool` keeps up to that many connections open and reuses them (the running
 * server's worker sends several messages at once; close it on shutdown); without it each message
 * opens a connection of its own.
 */
export function createTransport(smtpUrl: string, pool?: number): Transporter {
  return pool ? nodemailer.createTransport({ url: smtpUrl, pool: true, maxConnections: pool }) : nodemailer.createTransport(smtpUrl);
}

/**
 * Works one delivery. A delivery already sent is skipped, so a retried or duplicated job never sends
 * twice; the row is claimed (sending) by one atomic UPDATE before the SMTP call, and marked sent
 * after it. A failure records the reason and rethrows, so pg-boss retries with back-off; the last
 * failure leaves the row visibly failed.
 */
export async function deliver(ds: DataSource, transport: Transporter, logger: Logger, deliveryId: string, maxAttempts = 6): Promise<void> {
  // One statement (its row lock held only while it runs) instead of a transaction of four round trips:
  // the worker sends several messages at once, and each round trip is one more wait per message.
  const [[claimedRow]]: [Record<string, unknown>[], number] = await ds.query(
    `UPDATE email_deliveries SET status = 'sending', attempts = attempts + 1
      WHERE id = $1 AND status NOT IN ('sent', 'failed')
      RETURNING id, to_address, subject, body_text, body_html, letter_id, attempts`,
    [deliveryId],
  );
  const claimed = claimedRow && {
    id: claimedRow.id as string,
    toAddress: claimedRow.to_address as string,
    subject: claimedRow.subject as string,
    bodyText: claimedRow.body_text as string | null,
    bodyHtml: claimedRow.body_html as string | null,
    letterId: claimedRow.letter_id as string | null,
    attempts: claimedRow.attempts as number,
  };
  if (!claimed) return;
  try {
    const attachments = [];
    if (claimed.letterId) {
      const letter = await ds
        .getRepository(ClearanceLetter)
        .createQueryBuilder('l')
        .addSelect('l.pdf')
        .where('l.id = :id', { id: claimed.letterId })
        .getOne();
      if (letter?.pdf)
        attachments.push({ filename: `clearance-letter-${letter.effectiveFrom}.pdf`, content: letter.pdf, contentType: 'application/pdf' });
    }
    const info = await transport.sendMail({
      from: MAIL_FROM,
      to: claimed.toAddress,
      subject: claimed.subject,
      text: claimed.bodyText ?? '',
      html: claimed.bodyHtml ?? undefined,
      attachments,
      messageId: `<${claimed.id}@loadline.invalid>`,
    });
    // Sent: the body (which may hold a one-time link) is not kept any longer than needed.
    await ds
      .getRepository(EmailDelivery)
      .update(
        { id: claimed.id },
        { status: 'sent', sentAt: new Date(), messageId: info.messageId, bodyText: null, bodyHtml: null, lastError: null },
      );
  } catch (err) {
    const message = (err as Error).message?.slice(0, 500) ?? 'unknown error';
    const finalFailure = claimed.attempts >= maxAttempts;
    await ds.getRepository(EmailDelivery).update({ id: claimed.id }, { status: finalFailure ? 'failed' : 'queued', lastError: message });
    logger.warn({ err, deliveryId }, finalFailure ? 'e-mail failed for good' : 'e-mail failed; will retry');
    if (!finalFailure) throw err;
  }
}
