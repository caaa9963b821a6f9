import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import type { CareTeamRole } from '../../../policies/roles';
import { Membership } from './membership.entity';

@Entity({ name: 'care_team_assignments' })
@Index('care_team_assignments_key', ['athleteId', 'memberId', 'role'], { unique: true })
export class CareTeamAssignment {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('uuid', { name: 'athlete_id' })
  athleteId: string;

  @ManyToOne(() => Membership, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'athlete_id' })
  athlete?: Membership;

  @Index('care_team_assignments_member_idx')
  @Column('uuid', { name: 'member_id' })
  memberId: string;

  @ManyToOne(() => Membership, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'member_id' })
  member?: Membership;

  @Column('varchar', { length: 20 })
  role: CareTeamRole;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
