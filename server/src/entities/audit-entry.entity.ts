import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/**
 * One line of the audit trail. Append-only (database triggers refuse UPDATE, DELETE and TRUNCATE)
 * and hash-chained per organization: hash = SHA-256(prevHash + canonical entry).
 * No foreign keys: the trail must outlive what it describes.
 */
@Entity({ name: 'audit_entries' })
@Index('audit_entries_org_id_idx', ['organizationId', 'id'])
@Index('audit_entries_athlete_idx', ['organizationId', 'athleteId', 'id'])
export class AuditEntry {
  @PrimaryGeneratedColumn('increment', { type: 'bigint' })
  id: string;

  @Column('uuid', { name: 'organization_id', nullable: true })
  organizationId: string | null;

  @Column('timestamptz', { name: 'occurred_at' })
  occurredAt: Date;

  @Column('uuid', { name: 'actor_user_id', nullable: true })
  actorUserId: string | null;

  @Column('varchar', { length: 80 })
  action: string;

  /** The athlete the entry is about, when there is one: lets clinicians follow their athletes' trail. */
  @Column('uuid', { name: 'athlete_id', nullable: true })
  athleteId: string | null;

  @Column('varchar', { name: 'subject_type', length: 60 })
  subjectType: string;

  @Column('varchar', { name: 'subject_id', length: 64, nullable: true })
  subjectId: string | null;

  @Column('jsonb', { nullable: true })
  before: unknown;

  @Column('jsonb', { nullable: true })
  after: unknown;

  @Column('varchar', { name: 'request_id', length: 64, nullable: true })
  requestId: string | null;

  @Column('char', { name: 'prev_hash', length: 64 })
  prevHash: string;

  @Column('char', { length: 64 })
  hash: string;
}
