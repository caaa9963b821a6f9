import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { Membership } from './membership.entity';

@Entity({ name: 'guardian_links' })
@Index('guardian_links_key', ['athleteId', 'guardianId'], { unique: true })
export class GuardianLink {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('uuid', { name: 'athlete_id' })
  athleteId: string;

  @ManyToOne(() => Membership, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'athlete_id' })
  athlete?: Membership;

  @Index('guardian_links_guardian_idx')
  @Column('uuid', { name: 'guardian_id' })
  guardianId: string;

  @ManyToOne(() => Membership, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'guardian_id' })
  guardian?: Membership;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
