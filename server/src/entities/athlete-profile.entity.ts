import { Column, CreateDateColumn, Entity, Index, JoinColumn, OneToOne, PrimaryColumn, UpdateDateColumn, VersionColumn } from 'typeorm';
import { Membership } from './membership.entity';

/** What only athletes have. Keyed by the athlete's membership, which is the athlete's id everywhere. */
@Entity({ name: 'athlete_profiles' })
export class AthleteProfile {
  @PrimaryColumn('uuid', { name: 'membership_id' })
  id: string;

  @OneToOne(() => Membership, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'membership_id' })
  membership?: Membership;

  @Index('athlete_profiles_org_idx')
  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('date', { name: 'date_of_birth', nullable: true })
  dateOfBirth: string | null;

  @Column('varchar', { length: 80, nullable: true })
  sport: string | null;

  @Column('varchar', { length: 80, nullable: true })
  position: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;

  @VersionColumn({ type: 'int' })
  version: number;
}
