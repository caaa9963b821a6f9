import type { DeliveryDto, OutboxMessageDto } from '../../../policies/dto';
import { accessibleWhere } from '../core/accessible';
import { orgQuery } from '../core/command';
import { AppError } from '../core/errors';

/**
 * The local fake mail server's messages, for an admin while that fake is in use. Its mailbox is
 * shared by every organization: only messages of this organization's deliveries (matched by the
 * Message-ID deliver() sets) are listed, so no organization reads another's mail (ASVS 5.0 V8.4.1).
 */
export const outboxMessages = orgQuery<void, OutboxMessageDto[]>({
  name: 'outbox.messages',
  async run({ db, deps, ability, actor }) {
    if (deps.config.FAKE_MAIL !== 'true')
      throw new AppError('not_found', 'The outbox exists only while the local fake mail server is in use.');
    const acl = accessibleWhere(ability, 'read', 'Outbox', { organizationId: 'd.organization_id' });
    const rows: {
      id: string;
      received_at: Date;
      envelope_to: string[];
      subject: string | null;
      text_body: string | null;
      attachments: OutboxMessageDto['attachments'];
    }[] = await db
      .createQueryBuilder()
      .select(['f.id AS id', 'f.received_at AS received_at', 'f.envelope_to AS envelope_to', 'f.subject AS subject'])
      .addSelect(['f.text_body AS text_body', 'f.attachments AS attachments'])
      .from('fake_mailbox', 'f')
      .where(
        `EXISTS (SELECT 1 FROM email_deliveries d WHERE d.organization_id = :org AND ${acl.sql} AND f.message_id = '<' || d.id || '@loadline.invalid>')`,
        { org: actor.organizationId, ...acl.params },
      )
      .orderBy('f.id', 'DESC')
      .limit(200)
      .getRawMany();
    return rows.map((r) => ({
      id: String(r.id),
      receivedAt: new Date(r.received_at).toISOString(),
      to: r.envelope_to,
      subject: r.subject,
      text: r.text_body,
      attachments: r.attachments,
    }));
  },
});

/** The organization's outgoing e-mail and its delivery state (queued, sending, sent, failed with the reason). */
export const deliveries = orgQuery<void, DeliveryDto[]>({
  name: 'outbox.deliveries',
  async run({ db, ability, actor }) {
    const acl = accessibleWhere(ability, 'read', 'Outbox', { organizationId: 'd.organization_id' });
    const rows: {
      id: string;
      kind: string;
      to_address: string;
      subject: string;
      status: DeliveryDto['status'];
      attempts: number;
      last_error: string | null;
      created_at: Date;
      sent_at: Date | null;
    }[] = await db
      .createQueryBuilder()
      .select(['d.id AS id', 'd.kind AS kind', 'd.to_address AS to_address', 'd.subject AS subject', 'd.status AS status'])
      .addSelect(['d.attempts AS attempts', 'd.last_error AS last_error', 'd.created_at AS created_at', 'd.sent_at AS sent_at'])
      .from('email_deliveries', 'd')
      .where('d.organization_id = :org', { org: actor.organizationId })
      .andWhere(acl.sql, acl.params)
      .orderBy('d.created_at', 'DESC')
      .limit(300)
      .getRawMany();
    return rows.map((r) => ({
      id: r.id,
      kind: r.kind,
      to: r.to_address,
      subject: r.subject,
      status: r.status,
      attempts: r.attempts,
      lastError: r.last_error,
      createdAt: new Date(r.created_at).toISOString(),
      sentAt: r.sent_at ? new Date(r.sent_at).toISOString() : null,
    }));
  },
});
