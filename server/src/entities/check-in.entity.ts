import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/** The daily check-in: one per athlete per day (a second one that day replaces the first). */
@Entity({ name: 'check_ins' })
@Index('check_ins_athlete_date_key', ['athleteId', 'date'], { unique: true })
export class CheckIn {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('uuid', { name: 'athlete_id' })
  athleteId: string;

  @Column('date')
  date: string;

  @Column('numeric', { name: 'sleep_hours', precision: 4, scale: 1, transformer: { to: (v: number) => v, from: (v: string) => Number(v) } })
  sleepHours: number;

  @Column('smallint')
  soreness: number;

  @Column('smallint')
  readiness: number;

  @Column('smallint', { name: 'pain_now' })
  painNow: number;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
