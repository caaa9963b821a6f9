import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { TrainingLog } from './training-log.entity';

/** A short technique video of a set, linked to a logged session and one exercise in it. */
@Entity({ name: 'clips' })
@Index('clips_storage_key', ['storageKey'], { unique: true })
@Index('clips_athlete_idx', ['organizationId', 'athleteId', 'createdAt'])
@Index('clips_log_idx', ['trainingLogId'])
export class Clip {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('uuid', { name: 'athlete_id' })
  athleteId: string;

  @Column('uuid', { name: 'training_log_id' })
  trainingLogId: string;

  @ManyToOne(() => TrainingLog, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'training_log_id' })
  trainingLog?: TrainingLog;

  @Column('varchar', { length: 200 })
  exercise: string;

  @Column('varchar', { length: 500, nullable: true })
  caption: string | null;

  @Column('varchar', { name: 'media_type', length: 100 })
  mediaType: string;

  @Column('bigint', { name: 'size_bytes' })
  sizeBytes: string;

  @Column('char', { length: 64 })
  sha256: string;

  @Column('varchar', { name: 'storage_key', length: 300 })
  storageKey: string;

  @Column('uuid', { name: 'uploaded_by_user_id' })
  uploadedByUserId: string;

  @Column('varchar', { name: 'uploaded_by_name', length: 200 })
  uploadedByName: string;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
