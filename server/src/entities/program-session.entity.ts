import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn, VersionColumn } from 'typeorm';
import type { FitChange, FitState, FittedSession } from '../../../policies/load/team-fit-types';
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

  /** An athlete's version of this team session (team programming); null for any other session. */
  @Column('uuid', { name: 'team_session_id', nullable: true })
  teamSessionId: string | null;

  /** How the version relates to the team session as written; null for any other session. */
  @Column('varchar', { name: 'fit_state', length: 20, nullable: true })
  fitState: FitState | null;

  /** The line-by-line changes from the team session (empty when as written). */
  @Column('jsonb', { name: 'fit_changes', default: () => "'[]'" })
  fitChanges: FitChange[];

  /** The coach edited this version by hand: a change of the team session no longer rewrites it. */
  @Column('boolean', { default: false })
  overridden: boolean;

  /** A limit changed (or the team session changed under an override): the coach should look again. */
  @Column('boolean', { name: 'needs_review', default: false })
  needsReview: boolean;

  /** A re-fit waiting for the coach after a limit change: accepted, it replaces the content. */
  @Column('jsonb', { nullable: true })
  proposal: FittedSession | null;

  @Column('timestamptz', { name: 'reviewed_at', nullable: true })
  reviewedAt: Date | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;

  @VersionColumn({ type: 'int' })
  version: number;
}
