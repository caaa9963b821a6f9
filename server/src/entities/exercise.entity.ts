import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, VersionColumn } from 'typeorm';
import type { MovementPattern } from '../../../policies/load/patterns';
import type { LoadSteps } from '../../../policies/load/steps';
import type { Equipment } from '../../../policies/schemas/programs';

@Entity({ name: 'exercises' })
@Index('exercises_org_name_key', ['organizationId', 'name'], { unique: true })
export class Exercise {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('varchar', { length: 120 })
  name: string;

  @Column('text', { array: true, default: () => "'{}'" })
  patterns: MovementPattern[];

  @Column('varchar', { length: 20 })
  equipment: Equipment;

  @Column('boolean', { default: false })
  ballistic: boolean;

  @Column('jsonb')
  steps: LoadSteps;

  @Column('uuid', { name: 'reference_id', nullable: true })
  referenceId: string | null;

  @Column('boolean', { default: false })
  archived: boolean;

  /** Library exercises to use instead when this one is not allowed, in order of preference. */
  @Column('uuid', { name: 'use_instead', array: true, default: () => "'{}'" })
  useInstead: string[];

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @VersionColumn({ type: 'int' })
  version: number;
}
