import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

export type FlagKind = 'red_flag_emergency' | 'red_flag_urgent' | 'pain_report' | 'pain_rule' | 'over_limit';

/** Something the care team must look at: a red-flag report, a new pain report, a pain-rule breach. */
@Entity({ name: 'flags' })
@Index('flags_athlete_idx', ['organizationId', 'athleteId', 'createdAt'])
export class Flag {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('uuid', { name: 'athlete_id' })
  athleteId: string;

  @Column('varchar', { length: 30 })
  kind: FlagKind;

  @Column('varchar', { length: 10 })
  severity: 'emergency' | 'urgent' | 'routine';

  @Column('text')
  message: string;

  @Column('varchar', { name: 'suggested_action', length: 20, nullable: true })
  suggestedAction: 'keep' | 'reduce' | null;

  @Column('varchar', { name: 'source_type', length: 30 })
  sourceType: 'PainReport' | 'TrainingLog';

  @Column('uuid', { name: 'source_id' })
  sourceId: string;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @Column('timestamptz', { name: 'acknowledged_at', nullable: true })
  acknowledgedAt: Date | null;

  @Column('uuid', { name: 'acknowledged_by', nullable: true })
  acknowledgedBy: string | null;
}
