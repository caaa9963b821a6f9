import { Column, CreateDateColumn, Entity, PrimaryColumn } from 'typeorm';
import type { Breach } from '../../../policies/load/compliance';

/** A published session that breaches a plan changed after publishing: on hold for that athlete. */
@Entity({ name: 'session_holds' })
export class SessionHold {
  @PrimaryColumn('uuid', { name: 'session_id' })
  sessionId: string;

  @PrimaryColumn('uuid', { name: 'athlete_id' })
  athleteId: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('jsonb')
  breaches: Breach[];

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
