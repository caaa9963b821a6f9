import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import type { PlanStage } from '../../../policies/load/in-force';

/** One saved state of a plan. Rows are only ever added, so every earlier version stays readable. */
@Entity({ name: 'restriction_plan_versions' })
@Index('restriction_plan_versions_key', ['planId', 'version'], { unique: true })
export class RestrictionPlanVersion {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'plan_id' })
  planId: string;

  @Column('int')
  version: number;

  @Column('jsonb')
  stages: PlanStage[];

  @Column('text', { default: '' })
  guidance: string;

  @Column('varchar', { name: 'change_note', length: 500, nullable: true })
  changeNote: string | null;

  @Column('uuid', { name: 'created_by', nullable: true })
  createdBy: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
