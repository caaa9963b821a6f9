import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, OneToOne, PrimaryColumn, PrimaryGeneratedColumn } from 'typeorm';
import { User } from './user.entity';

/**
 * A person's authenticator for two-step sign-in. The secret is stored encrypted (AES-256-GCM); the
 * row exists but is not in force until enabled_at is set (the person confirmed a code).
 */
@Entity({ name: 'user_totp' })
export class UserTotp {
  @PrimaryColumn('uuid', { name: 'user_id' })
  userId: string;

  @OneToOne(() => User, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id' })
  user?: User;

  /** `v1.<iv>.<tag>.<ciphertext>`, base64url parts. */
  @Column('text', { name: 'secret_enc' })
  secretEnc: string;

  @Column('timestamptz', { name: 'enabled_at', nullable: true })
  enabledAt: Date | null;

  /** The 30-second step of the last accepted code: that code and older ones are refused. */
  @Column('bigint', { name: 'last_used_step', nullable: true })
  lastUsedStep: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}

/** One-time recovery code for two-step sign-in; only a keyed hash is stored. */
@Entity({ name: 'totp_recovery_codes' })
export class TotpRecoveryCode {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Index('totp_recovery_codes_user_idx')
  @Column('uuid', { name: 'user_id' })
  userId: string;

  @ManyToOne(() => User, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id' })
  user?: User;

  @Column('char', { name: 'code_hash', length: 64 })
  codeHash: string;

  @Column('timestamptz', { name: 'used_at', nullable: true })
  usedAt: Date | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
