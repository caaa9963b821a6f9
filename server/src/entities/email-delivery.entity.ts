import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/**
 * One e-mail to one address. The row commits with the change that caused it; the queue job only
 * carries its id. Status sending/sent makes a retried job skip what already went out. The body is
 * cleared once sent, so links and tokens are not kept at rest longer than needed.
 */
@Entity({ name: 'email_deliveries' })
@Index('email_deliveries_letter_idx', ['letterId'])
export class EmailDelivery {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id', nullable: true })
  organizationId: string | null;

  @Column('varchar', { length: 40 })
  kind: string;

  @Column('varchar', { name: 'to_address', length: 254 })
  toAddress: string;

  @Column('uuid', { name: 'recipient_id', nullable: true })
  recipientId: string | null;

  @Column('varchar', { length: 200 })
  subject: string;

  @Column('text', { name: 'body_text', nullable: true })
  bodyText: string | null;

  @Column('text', { name: 'body_html', nullable: true })
  bodyHtml: string | null;

  @Column('uuid', { name: 'letter_id', nullable: true })
  letterId: string | null;

  @Column('varchar', { length: 10, default: 'queued' })
  status: 'queued' | 'sending' | 'sent' | 'failed';

  @Column('int', { default: 0 })
  attempts: number;

  @Column('text', { name: 'last_error', nullable: true })
  lastError: string | null;

  @Column('varchar', { name: 'message_id', length: 200, nullable: true })
  messageId: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @Column('timestamptz', { name: 'sent_at', nullable: true })
  sentAt: Date | null;
}
