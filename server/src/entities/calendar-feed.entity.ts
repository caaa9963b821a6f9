import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/** A private iCalendar feed of one membership (migration 1766900000000): only the token's hash is stored. */
@Entity({ name: 'calendar_feeds' })
@Index('calendar_feeds_token_idx', ['tokenHash'], { unique: true })
export class CalendarFeed {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('uuid', { name: 'membership_id' })
  membershipId: string;

  /** SHA-256 of the URL's token, hex. */
  @Column('char', { name: 'token_hash', length: 64 })
  tokenHash: string;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @Column('timestamptz', { name: 'revoked_at', nullable: true })
  revokedAt: Date | null;
}
