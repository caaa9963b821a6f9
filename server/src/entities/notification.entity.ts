import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/** An in-app notice to one person (e-mail copies arrive with the e-mail issue). */
@Entity({ name: 'notifications' })
@Index('notifications_recipient_idx', ['recipientId', 'createdAt'])
export class Notification {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('uuid', { name: 'recipient_id' })
  recipientId: string;

  @Column('uuid', { name: 'athlete_id', nullable: true })
  athleteId: string | null;

  @Column('varchar', { length: 40 })
  kind: string;

  @Column('varchar', { length: 10 })
  severity: 'emergency' | 'urgent' | 'routine';

  @Column('varchar', { length: 200 })
  title: string;

  @Column('text')
  body: string;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @Column('timestamptz', { name: 'read_at', nullable: true })
  readAt: Date | null;
}
