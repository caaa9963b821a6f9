import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import type { Role } from '../../../policies/roles';
import { Organization } from './organization.entity';
import { User } from './user.entity';

/** A one-time invitation. Only the SHA-256 of the token is stored. */
@Entity({ name: 'invitations' })
export class Invitation {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Index('invitations_org_idx')
  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @ManyToOne(() => Organization, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organization_id' })
  organization?: Organization;

  @Column('varchar', { length: 254 })
  email: string;

  @Column('text', { array: true })
  roles: Role[];

  @Column('varchar', { name: 'display_name', length: 120, nullable: true })
  displayName: string | null;

  @Column('date', { name: 'date_of_birth', nullable: true })
  dateOfBirth: string | null;

  @Column('varchar', { length: 80, nullable: true })
  sport: string | null;

  @Index('invitations_token_hash_key', { unique: true })
  @Column('char', { name: 'token_hash', length: 64 })
  tokenHash: string;

  @Column('timestamptz', { name: 'expires_at' })
  expiresAt: Date;

  @Column('timestamptz', { name: 'accepted_at', nullable: true })
  acceptedAt: Date | null;

  @Column('timestamptz', { name: 'revoked_at', nullable: true })
  revokedAt: Date | null;

  @Column('uuid', { name: 'invited_by', nullable: true })
  invitedBy: string | null;

  @ManyToOne(() => User, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'invited_by' })
  inviter?: User;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
