import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn, VersionColumn } from 'typeorm';

/** A logged training session. Loads are kg; the session load is session RPE × minutes (AU). */
@Entity({ name: 'training_logs' })
@Index('training_logs_athlete_date_idx', ['organizationId', 'athleteId', 'date'])
export class TrainingLog {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('uuid', { name: 'athlete_id' })
  athleteId: string;

  @Column('date')
  date: string;

  @Column('smallint', { name: 'duration_minutes' })
  durationMinutes: number;

  @Column('smallint', { name: 'session_rpe' })
  sessionRpe: number;

  @Column('smallint', { name: 'pain_before' })
  painBefore: number;

  @Column('smallint', { name: 'pain_during' })
  painDuring: number;

  /** Pain after the session (that evening), 0–10, recordable until the end of the session's day. */
  @Column('smallint', { name: 'pain_after', nullable: true })
  painAfter: number | null;

  @Column('smallint', { name: 'pain_next_morning', nullable: true })
  painNextMorning: number | null;

  /** The ceiling in force that day, kept with the log so later plan edits do not rewrite history. */
  @Column('smallint', { name: 'pain_ceiling' })
  painCeiling: number;

  /** The planned session this log was made from ("Log this session"); null for unplanned training. */
  @Column('uuid', { name: 'session_id', nullable: true })
  sessionId: string | null;

  @Column('jsonb', { default: () => "'[]'" })
  sets: { exercise: string; exerciseId?: string | null; loadKg: number; reps: number; rpe?: number | null }[];

  @Column('text', { nullable: true })
  notes: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;

  @VersionColumn({ type: 'int' })
  version: number;
}
