import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

const numeric = { to: (v: number | null) => v, from: (v: string | null) => (v === null ? null : Number(v)) };

/** One entry of an athlete's strength history for a lift: a tested max, an estimate, or a logged set. */
@Entity({ name: 'baselines' })
@Index('baselines_athlete_exercise_idx', ['athleteId', 'exerciseId', 'testedOn'])
export class Baseline {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('uuid', { name: 'athlete_id' })
  athleteId: string;

  @Column('uuid', { name: 'exercise_id' })
  exerciseId: string;

  /** tested and estimated are entered by staff and set the engine's 1RM; logged comes from training logs (history only). */
  @Column('varchar', { length: 10 })
  kind: 'tested' | 'estimated' | 'logged';

  @Column('numeric', { name: 'load_kg', precision: 7, scale: 2, transformer: numeric })
  loadKg: number;

  @Column('smallint')
  reps: number;

  @Column('numeric', { precision: 3, scale: 1, nullable: true, transformer: numeric })
  rpe: number | null;

  @Column('numeric', { name: 'e1rm_kg', precision: 7, scale: 2, transformer: numeric })
  e1rmKg: number;

  @Column('varchar', { length: 10 })
  formula: 'tested' | 'epley' | 'brzycki';

  @Column('boolean', { name: 'low_reliability', default: false })
  lowReliability: boolean;

  @Column('date', { name: 'tested_on' })
  testedOn: string;

  @Column('uuid', { name: 'created_by', nullable: true })
  createdBy: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
