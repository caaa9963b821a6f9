import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn, VersionColumn } from 'typeorm';

/** A program for one athlete or a group; its sessions are checked athlete by athlete. */
@Entity({ name: 'programs' })
@Index('programs_org_idx', ['organizationId'])
export class Program {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('varchar', { length: 120 })
  name: string;

  @Column('uuid', { name: 'athlete_ids', array: true })
  athleteIds: string[];

  /** A team program: written once for this group; it has no athletes of its own (athleteIds is empty). */
  @Column('uuid', { name: 'group_id', nullable: true })
  groupId: string | null;

  /** One athlete's program of fitted versions of this team program's sessions. */
  @Column('uuid', { name: 'team_program_id', nullable: true })
  teamProgramId: string | null;

  @Column('uuid', { name: 'created_by', nullable: true })
  createdBy: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;

  @VersionColumn({ type: 'int' })
  version: number;
}
