import type { EntityManager } from 'typeorm';
import { AppError } from '../core/errors';
import { Group, Program } from '../entities';
import type { ActorWithOrg } from './actor';

/**
 * Who may see and change a group's team program. A team program has no athletes of its own
 * (programs.athlete_ids is empty), so the athlete-by-athlete check of authorizeProgram would let
 * anyone through; it is decided by the group instead:
 * - an admin of the organization, or a coach of the group, reads and changes it;
 * - a clinician on the care team of any athlete of the group reads it;
 * - anyone else is told it was not found (its existence is not revealed; OWASP ASVS 5.0 V8.2.2).
 * Each athlete's own version is an ordinary program and is authorised as one (authorizeProgram).
 */
export async function teamProgramFor(
  m: EntityManager,
  actor: ActorWithOrg,
  programId: string,
  action: 'read' | 'update',
): Promise<{ program: Program; group: Group }> {
  const program = await m.findOne(Program, { where: { id: programId, organizationId: actor.organizationId } });
  const group = program?.groupId ? await m.findOne(Group, { where: { id: program.groupId, organizationId: actor.organizationId } }) : null;
  if (!program || !group) throw new AppError('not_found', 'That team program was not found.');
  await authorizeGroupWork(m, actor, group, action, 'team program');
  // An archived group is kept for the record and changes no more (commands/groups.ts): nor do its team
  // programs. The versions already published stay in each athlete's own program.
  if (action === 'update' && group.archived)
    throw new AppError('conflict', 'That group is archived: its team programs are kept for the record and can no longer be changed.');
  return { program, group };
}

/** The same rule for anything that belongs to a group's team work (its team programs, their sessions, the floor sheet). */
export async function authorizeGroupWork(
  m: EntityManager,
  actor: ActorWithOrg,
  group: Pick<Group, 'id'>,
  action: 'read' | 'update',
  what: string,
): Promise<void> {
  if (actor.roles.includes('admin')) return;
  const rows: { role: 'coach' | 'athlete'; member_id: string }[] = await m.query(
    `SELECT role, member_id FROM group_members WHERE group_id = $1`,
    [group.id],
  );
  const coach = actor.roles.includes('coach') && rows.some((r) => r.role === 'coach' && r.member_id === actor.membershipId);
  if (coach) return;
  const clinician = actor.roles.includes('clinician') && rows.some((r) => r.role === 'athlete' && actor.clinicianOf.includes(r.member_id));
  if (clinician && action === 'read') return;
  if (clinician) throw new AppError('forbidden', `Only the group's coaches and the organization's admins can change its ${what}.`);
  throw new AppError('not_found', `That ${what} was not found.`);
}
