import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/**
 * A request to start an organization from the public page, waiting for its first admin to confirm
 * the e-mail address. The organization itself does not exist until then, so nothing of it is usable
 * before the address is proven. Only the SHA-256 of the link's token is stored; the password's bcrypt
 * hash is kept until the link is used or expires, then cleared.
 */
@Entity({ name: 'organization_signups' })
export class OrganizationSignup {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('varchar', { name: 'organization_name', length: 200 })
  organizationName: string;

  /** ISO 3166-1 alpha-2 (policies/countries.ts). */
  @Column('varchar', { length: 2 })
  country: string;

  @Column('varchar', { name: 'time_zone', length: 64 })
  timeZone: string;

  @Column('varchar', { name: 'admin_name', length: 120 })
  adminName: string;

  @Index('organization_signups_email_idx')
  @Column('varchar', { length: 254 })
  email: string;

  /** Null once the link is used: a new account took it, or the address already had one. */
  @Column('varchar', { name: 'password_hash', length: 100, nullable: true })
  passwordHash: string | null;

  @Index('organization_signups_token_hash_key', { unique: true })
  @Column('char', { name: 'token_hash', length: 64 })
  tokenHash: string;

  @Column('timestamptz', { name: 'expires_at' })
  expiresAt: Date;

  @Column('timestamptz', { name: 'confirmed_at', nullable: true })
  confirmedAt: Date | null;

  /** The organization the confirmation created. */
  @Column('uuid', { name: 'organization_id', nullable: true })
  organizationId: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
