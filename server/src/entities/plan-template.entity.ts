import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn, VersionColumn } from 'typeorm';
import type { TemplateStage } from '../../../policies/load/plan-template';

/** A restriction plan as days from its start, shared in the organization (migration 1766100000000). */
@Entity({ name: 'plan_templates' })
export class PlanTemplate {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  /** The author's membership: only they (or an admin) change the template. */
  @Column('uuid', { name: 'author_id' })
  authorId: string;

  @Column('varchar', { length: 120 })
  name: string;

  @Column('text', { default: '' })
  description: string;

  @Column('jsonb')
  stages: TemplateStage[];

  @Column('text', { default: '' })
  guidance: string;

  @Column('boolean', { default: false })
  archived: boolean;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;

  @VersionColumn({ type: 'int' })
  version: number;
}
