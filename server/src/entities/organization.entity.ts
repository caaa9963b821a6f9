import type { LetterPaper } from '../../../policies/letter-paper';
import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, VersionColumn } from 'typeorm';

@Entity({ name: 'organizations' })
export class Organization {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('varchar', { length: 200 })
  name: string;

  /** Shown on the stop-and-seek-care screen; local numbers differ, so each organization sets its own. */
  @Column('varchar', { name: 'emergency_number', length: 30, default: '911' })
  emergencyNumber: string;

  /** Guardians may watch their athlete's technique clips (off unless an admin turns it on). */
  @Column('boolean', { name: 'guardians_see_clips', default: false })
  guardiansSeeClips: boolean;

  /** IANA zone whose calendar day is "today" for everyone in the organization (policies/today.ts). */
  @Column('varchar', { name: 'time_zone', length: 64, default: 'UTC' })
  timeZone: string;

  /** Paper for clearance letters; null: the paper of the time zone's country (policies/letter-paper.ts). */
  @Column('varchar', { name: 'letter_paper', length: 6, nullable: true })
  letterPaper: LetterPaper | null;

  /** ISO 3166-1 alpha-2 (policies/countries.ts); null for organizations made before it was asked. */
  @Column('varchar', { length: 2, nullable: true })
  country: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @VersionColumn({ type: 'int' })
  version: number;
}
