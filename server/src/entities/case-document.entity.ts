import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { CaseRecord } from './case.entity';

/** An outside document (physician's note, imaging report, referral) attached to a case. */
@Entity({ name: 'case_documents' })
@Index('case_documents_storage_key', ['storageKey'], { unique: true })
@Index('case_documents_case_idx', ['caseId', 'documentDate'])
@Index('case_documents_athlete_idx', ['organizationId', 'athleteId'])
export class CaseDocument {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('uuid', { name: 'athlete_id' })
  athleteId: string;

  @Column('uuid', { name: 'case_id' })
  caseId: string;

  @ManyToOne(() => CaseRecord, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'case_id' })
  case?: CaseRecord;

  @Column('varchar', { length: 200 })
  title: string;

  @Column('date', { name: 'document_date' })
  documentDate: string;

  @Column('varchar', { name: 'issued_by', length: 200 })
  issuedBy: string;

  /** Detected from the file's own bytes, never the browser's claim. */
  @Column('varchar', { name: 'media_type', length: 100 })
  mediaType: string;

  /** bigint comes back from pg as a string; the DTO converts it. */
  @Column('bigint', { name: 'size_bytes' })
  sizeBytes: string;

  @Column('char', { length: 64 })
  sha256: string;

  @Column('varchar', { name: 'storage_key', length: 300 })
  storageKey: string;

  @Column('uuid', { name: 'uploaded_by_user_id' })
  uploadedByUserId: string;

  @Column('varchar', { name: 'uploaded_by_name', length: 200 })
  uploadedByName: string;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
