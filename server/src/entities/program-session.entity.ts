import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn, VersionColumn } from 'typeorm';
import type { SessionContent } from '../../../policies/schemas/programs';

/** One dated session of a program: exercises and their planned sets, kept as one document. */
@Entity({ name: 'program_sessions' })
@Index('program_sessions_program_date_idx', ['programId', 'date'])
export class ProgramSession {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('uuid', { name: 'program_id' })
  programId: string;

  @Column('date')
  date: string;

  @Column('varchar', { length: 120 })
  title: string;

  @Column('jsonb')
  content: SessionContent;

  @Column('varchar', { length: 10, default: 'draft' })
  status: 'draft' | 'published';

  @Column('timestamptz', { name: 'published_at', nullable: true })
  publishedAt: Date | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;

  @VersionColumn({ type: 'int' })
  version: number;
}
