import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import type { BodyRegion } from '../../../policies/body-regions';
import type { MovementPattern } from '../../../policies/load/patterns';
import type { RedFlagAnswers, ReportRoute } from '../../../policies/red-flags';

@Entity({ name: 'pain_reports' })
@Index('pain_reports_athlete_idx', ['organizationId', 'athleteId', 'reportedAt'])
export class PainReport {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('uuid', { name: 'athlete_id' })
  athleteId: string;

  @Column('uuid', { name: 'reported_by', nullable: true })
  reportedBy: string | null;

  @Column('text', { name: 'body_regions', array: true })
  bodyRegions: BodyRegion[];

  @Column('smallint', { name: 'pain_now' })
  painNow: number;

  @Column('smallint', { name: 'pain_worst_24h' })
  painWorst24h: number;

  @Column('date', { name: 'onset_date' })
  onsetDate: string;

  @Column('text', { name: 'aggravating_patterns', array: true, default: () => "'{}'" })
  aggravatingPatterns: MovementPattern[];

  @Column('boolean', { name: 'started_in_training' })
  startedInTraining: boolean;

  @Column('text', { nullable: true })
  note: string | null;

  @Column('jsonb', { name: 'red_flags' })
  redFlags: RedFlagAnswers;

  @Column('varchar', { length: 10 })
  route: ReportRoute;

  /** The case the report opened or joined, when it set a status. */
  @Column('uuid', { name: 'case_id', nullable: true })
  caseId: string | null;

  @CreateDateColumn({ name: 'reported_at', type: 'timestamptz' })
  reportedAt: Date;
}
