import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';

/**
 * The restriction plan of a case. Its content lives in versions; `version` is the number of the
 * current one and doubles as the optimistic lock for the next edit.
 */
@Entity({ name: 'restriction_plans' })
@Index('restriction_plans_athlete_idx', ['organizationId', 'athleteId'])
export class RestrictionPlan {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('uuid', { name: 'athlete_id' })
  athleteId: string;

  @Index('restriction_plans_case_key', { unique: true })
  @Column('uuid', { name: 'case_id' })
  caseId: string;

  @Column('int')
  version: number;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;
}
