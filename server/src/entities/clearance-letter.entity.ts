import type { LetterBasis } from '../../../policies/letter-basis';
import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn, VersionColumn } from 'typeorm';

/**
 * A clearance letter. A draft can change; signing freezes it: the PDF is made once, stored with its
 * SHA-256, and never regenerated. Only the hash of the verification code is kept.
 */
@Entity({ name: 'clearance_letters' })
@Index('clearance_letters_athlete_idx', ['organizationId', 'athleteId', 'createdAt'])
export class ClearanceLetter {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('uuid', { name: 'athlete_id' })
  athleteId: string;

  @Column('varchar', { length: 10 })
  decision: 'full' | 'limited';

  @Column('date', { name: 'effective_from' })
  effectiveFrom: string;

  @Column('date', { name: 'valid_until', nullable: true })
  validUntil: string | null;

  @Column('jsonb', { default: () => "'[]'" })
  limits: string[];

  /** The status and limits the letter rests on, recorded when it is signed (policies/letter-basis.ts). */
  @Column('jsonb', { name: 'limits_basis', nullable: true })
  limitsBasis: LetterBasis | null;

  @Column('varchar', { name: 'clinician_name', length: 120 })
  clinicianName: string;

  @Column('varchar', { length: 80 })
  credential: string;

  @Column('varchar', { name: 'licence_number', length: 80 })
  licenceNumber: string;

  @Column('text', { name: 'family_note', default: '' })
  familyNote: string;

  @Column('varchar', { length: 120, nullable: true })
  signature: string | null;

  @Column('timestamptz', { name: 'signed_at', nullable: true })
  signedAt: Date | null;

  @Column('char', { name: 'code_hash', length: 64, nullable: true })
  codeHash: string | null;

  /**
   * The record of signing: 'superseded' once a later letter has been signed, with superseded_by naming
   * it. Whether that letter has taken over yet depends on its start date, so what readers are shown
   * is worked out from the dates (`standingToday` in services/letters.ts), not read from here.
   */
  @Column('varchar', { length: 12, default: 'draft' })
  status: 'draft' | 'signed' | 'superseded';

  @Column('uuid', { name: 'superseded_by', nullable: true })
  supersededBy: string | null;

  @Column('bytea', { nullable: true, select: false })
  pdf: Buffer | null;

  @Column('char', { name: 'pdf_sha256', length: 64, nullable: true })
  pdfSha256: string | null;

  @Column('uuid', { name: 'created_by', nullable: true })
  createdBy: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;

  @VersionColumn({ type: 'int' })
  version: number;
}
