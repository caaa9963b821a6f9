import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import type { ParticipationStatus } from '../../../policies/load/patterns';

/** Each status a clinician set on a case, with the day it took effect. Never edited, only added to. */
@Entity({ name: 'participation_status_changes' })
@Index('participation_status_changes_case_idx', ['caseId', 'effectiveFrom'])
@Index('participation_status_changes_athlete_idx', ['organizationId', 'athleteId'])
export class ParticipationStatusChange {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('uuid', { name: 'athlete_id' })
  athleteId: string;

  @Column('uuid', { name: 'case_id' })
  caseId: string;

  @Column('varchar', { length: 10 })
  status: ParticipationStatus;

  @Column('date', { name: 'effective_from' })
  effectiveFrom: string;

  @Column('text', { nullable: true })
  note: string | null;

  @Column('uuid', { name: 'set_by', nullable: true })
  setBy: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
