import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/**
 * A coach's request to go past a cap on specific sets of one session for one athlete, and the
 * clinician's decision. A grant covers the granted sets as they were when granted: the fingerprint
 * of each set is kept, and an edited set is no longer covered.
 */
@Entity({ name: 'program_exceptions' })
@Index('program_exceptions_session_idx', ['sessionId', 'athleteId'])
export class ProgramException {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('uuid', { name: 'session_id' })
  sessionId: string;

  @Column('uuid', { name: 'athlete_id' })
  athleteId: string;

  @Column('text', { name: 'set_ids', array: true })
  setIds: string[];

  @Column('text')
  reason: string;

  @Column('uuid', { name: 'requested_by', nullable: true })
  requestedBy: string | null;

  @Column('varchar', { length: 10, default: 'pending' })
  status: 'pending' | 'granted' | 'refused';

  @Column('text', { name: 'granted_set_ids', array: true, default: () => "'{}'" })
  grantedSetIds: string[];

  @Column('jsonb', { name: 'set_fingerprints', default: () => "'{}'" })
  setFingerprints: Record<string, string>;

  @Column('uuid', { name: 'decided_by', nullable: true })
  decidedBy: string | null;

  @Column('timestamptz', { name: 'decided_at', nullable: true })
  decidedAt: Date | null;

  @Column('text', { name: 'decision_note', nullable: true })
  decisionNote: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
