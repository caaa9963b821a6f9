import { Column, CreateDateColumn, Entity, PrimaryColumn, PrimaryGeneratedColumn, UpdateDateColumn, VersionColumn } from 'typeorm';

export const GROUP_KINDS = ['team', 'position', 'block'] as const;
export type GroupKind = (typeof GROUP_KINDS)[number];

/** A team, a position group or a training block: coaches and athletes of one organization. */
@Entity({ name: 'groups' })
export class Group {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @Column('varchar', { length: 120 })
  name: string;

  @Column('varchar', { length: 20 })
  kind: GroupKind;

  @Column('boolean', { default: false })
  archived: boolean;

  @Column('uuid', { name: 'created_by', nullable: true })
  createdBy: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;

  @VersionColumn({ type: 'int' })
  version: number;
}

/** One person in a group, as its coach or as one of its athletes (an athlete may be in several groups). */
@Entity({ name: 'group_members' })
export class GroupMember {
  @PrimaryColumn('uuid', { name: 'group_id' })
  groupId: string;

  @PrimaryColumn('uuid', { name: 'member_id' })
  memberId: string;

  @PrimaryColumn('varchar', { length: 10 })
  role: 'coach' | 'athlete';

  @Column('uuid', { name: 'organization_id' })
  organizationId: string;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
