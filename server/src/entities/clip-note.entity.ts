import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { Clip } from './clip.entity';

/** A coach's or clinician's note pinned to a time in a clip. */
@Entity({ name: 'clip_notes' })
@Index('clip_notes_clip_idx', ['clipId', 'atMs'])
export class ClipNote {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('uuid', { name: 'athlete_id' })
  athleteId: string;

  @Column('uuid', { name: 'clip_id' })
  clipId: string;

  @ManyToOne(() => Clip, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'clip_id' })
  clip?: Clip;

  @Column('int', { name: 'at_ms' })
  atMs: number;

  @Column('text')
  body: string;

  @Column('uuid', { name: 'author_user_id' })
  authorUserId: string;

  @Column('varchar', { name: 'author_name', length: 200 })
  authorName: string;

  @Column('varchar', { name: 'author_role', length: 20 })
  authorRole: 'athlete' | 'coach' | 'clinician';

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
