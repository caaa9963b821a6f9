import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn, VersionColumn } from 'typeorm';
import type { Unit } from '../../../policies/schemas/common';

@Entity({ name: 'users' })
export class User {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  /** Stored lower-cased; the unique index makes e-mail the sign-in key. */
  @Index('users_email_key', { unique: true })
  @Column('varchar', { length: 254 })
  email: string;

  @Column('varchar', { name: 'password_hash', length: 100 })
  passwordHash: string;

  @Column('varchar', { name: 'display_name', length: 120 })
  displayName: string;

  @Column('varchar', { name: 'unit_pref', length: 2, default: 'kg' })
  unitPref: Unit;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;

  @VersionColumn({ type: 'int' })
  version: number;
}
