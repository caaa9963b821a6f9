import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, VersionColumn } from 'typeorm';
import type { CheckedRow } from '../../../policies/roster';

export type RosterImportStatus = 'previewed' | 'queued' | 'running' | 'done' | 'failed';

/** One uploaded roster file: its checked rows, then the background import's progress and counts. */
@Entity({ name: 'roster_imports' })
@Index('roster_imports_org_idx', ['organizationId', 'createdAt'])
export class RosterImport {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('uuid', { name: 'created_by', nullable: true })
  createdBy: string | null;

  @Column('varchar', { length: 12 })
  status: RosterImportStatus;

  @Column('varchar', { name: 'file_name', length: 200, nullable: true })
  fileName: string | null;

  @Column('char', { name: 'file_sha256', length: 64 })
  fileSha256: string;

  /** The rows as checked from the file alone; each is planned again against the database when imported. */
  @Column('jsonb')
  rows: CheckedRow[];

  @Column('int', { name: 'total_rows' })
  totalRows: number;

  @Column('int', { default: 0 })
  processed: number;

  @Column('int', { name: 'created_rows', default: 0 })
  createdRows: number;

  @Column('int', { name: 'updated_rows', default: 0 })
  updatedRows: number;

  @Column('int', { name: 'unchanged_rows', default: 0 })
  unchangedRows: number;

  @Column('int', { name: 'skipped_rows', default: 0 })
  skippedRows: number;

  @Column('int', { default: 0 })
  invitations: number;

  @Column('varchar', { length: 500, nullable: true })
  error: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @Column('timestamptz', { name: 'started_at', nullable: true })
  startedAt: Date | null;

  @Column('timestamptz', { name: 'finished_at', nullable: true })
  finishedAt: Date | null;

  @VersionColumn({ type: 'int' })
  version: number;
}
