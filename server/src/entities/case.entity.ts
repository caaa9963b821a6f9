import {
  Column,
  CreateDateColumn,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
  VersionColumn,
} from 'typeorm';
import type { BodyRegion } from '../../../policies/body-regions';
import { Membership } from './membership.entity';

/** An injury episode of one athlete, opened and run by a clinician on the care team. */
@Entity({ name: 'cases' })
@Index('cases_athlete_idx', ['organizationId', 'athleteId'])
export class CaseRecord {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('uuid', { name: 'athlete_id' })
  athleteId: string;

  @ManyToOne(() => Membership, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'athlete_id' })
  athlete?: Membership;

  @Column('text', { name: 'body_regions', array: true })
  bodyRegions: BodyRegion[];

  @Column('date', { name: 'onset_date' })
  onsetDate: string;

  @Column('varchar', { length: 200, nullable: true })
  diagnosis: string | null;

  @Column('text', { name: 'clinical_notes', nullable: true })
  clinicalNotes: string | null;

  @Column('date', { name: 'review_date', nullable: true })
  reviewDate: string | null;

  @Column('uuid', { name: 'opened_by', nullable: true })
  openedBy: string | null;

  @Column('date', { name: 'closed_on', nullable: true })
  closedOn: string | null;

  @Column('text', { name: 'closing_note', nullable: true })
  closingNote: string | null;

  @CreateDateColumn({ name: 'opened_at', type: 'timestamptz' })
  openedAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;

  @VersionColumn({ type: 'int' })
  version: number;
}
