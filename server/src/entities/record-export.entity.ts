import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** A request for a person's whole record and, once built, its ZIP and link (migration 1767000000000). */
@Entity({ name: 'record_exports' })
export class RecordExport {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  /** The athlete membership the record is about. */
  @Column('uuid', { name: 'athlete_id' })
  athleteId: string;

  /** The user who asked: the only one who may download it. */
  @Column('uuid', { name: 'requested_by' })
  requestedBy: string;

  @Column('varchar', { length: 16, default: 'queued' })
  status: 'queued' | 'ready' | 'failed';

  @Column('varchar', { name: 'storage_key', length: 200, nullable: true })
  storageKey: string | null;

  /** bigint comes back from pg as a string; read it with Number(). */
  @Column('bigint', { name: 'size_bytes', nullable: true })
  sizeBytes: string | null;

  @Column('char', { length: 64, nullable: true })
  sha256: string | null;

  /** SHA-256 of the link's secret; the secret itself is only ever in the e-mail. */
  @Column('char', { name: 'token_hash', length: 64, nullable: true, select: false })
  tokenHash: string | null;

  @Column('text', { nullable: true })
  problem: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @Column('timestamptz', { name: 'ready_at', nullable: true })
  readyAt: Date | null;

  @Column('timestamptz', { name: 'expires_at', nullable: true })
  expiresAt: Date | null;

  @Column('timestamptz', { name: 'downloaded_at', nullable: true })
  downloadedAt: Date | null;
}
