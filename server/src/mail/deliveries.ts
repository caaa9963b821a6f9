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

export function createTransport(smtpUrl: string): Transporter {
  return nodemailer.createTransport(smtpUrl);
}

/**
 * Works one delivery. A delivery already sent is skipped, so a retried or duplicated job never sends
 * twice; the row is claimed (sending) in its own transaction before the SMTP call, and marked sent
 * after it. A failure records the reason and rethrows, so pg-boss retries with back-off; the last
 * failure leaves the row visibly failed.
 */
export async function deliver(ds: DataSource, transport: Transporter, logger: Logger, deliveryId: string, maxAttempts = 6): Promise<void> {
  const claimed = await ds.transaction(async (m) => {
    const row = await m
      .createQueryBuilder(EmailDelivery, 'd')
      .setLock('pessimistic_write')
      .where('d.id = :id', { id: deliveryId })
      .getOne();
    if (!row || row.status === 'sent' || row.status === 'failed') return null;
    await m.update(EmailDelivery, { id: row.id }, { status: 'sending', attempts: row.attempts + 1 });
    return { ...row, attempts: row.attempts + 1 };
  });
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
