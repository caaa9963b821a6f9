import type { GroupDto } from '../../../policies/dto/teams';
import type { GroupCreateInput, GroupKind, GroupMembersInput } from '../../../policies/schemas/groups';
import type { Role } from '../../../policies/roles';
import { orgCommand, type OrgCommandCtx } from '../core/command';
import { authorize } from '../core/authorize';
import { AppError } from '../core/errors';
import { Group, GroupMember } from '../entities';
import { groupDtos, groupSubject, readableGroup, type GroupMembers } from '../queries/groups';
import { isUniqueViolation } from '../services/org-members';
import { onGroupAthletesChanged } from '../services/team-membership';
import { updateVersioned } from '../services/versioned';

/**
 * Groups: a team, a position group, a training block. A group's coaches coach its athletes as a
 * care-team coach does (services/actor.ts), so every change of who is in a group changes who sees
 * whom on the next request, and who must be told of an athlete's held sessions: those commands go
 * through the one "limits changed" path (commands/limits.ts), as care-team changes do. Only admins
 * decide who coaches a group and may add any athlete; its coaches keep its name and its athletes,
 * adding only athletes they already coach.
 */

const DUPLICATE = 'A group with that name already exists in this organization.';

/** Each id must be an active member of this organization holding `role`; refuses naming the field otherwise. */
async function requireMembers(ctx: OrgCommandCtx, ids: string[], role: Role, field: string): Promise<void> {
  if (ids.length === 0) return;
  const rows: { id: string }[] = await ctx.m.query(
    `SELECT id FROM memberships WHERE id = ANY($1::uuid[]) AND organization_id = $2 AND active AND $3 = ANY(roles)`,
    [ids, ctx.actor.organizationId, role],
  );
  if (rows.length !== ids.length)
    throw new AppError('validation_failed', `Please check the form: ${field} must all be ${role}s in this organization.`, {
      [field]: [`must all be ${role}s in this organization`],
    });
}

/**
 * A coach who is not an admin adds only athletes they already coach (through a care team or another
 * group of theirs): otherwise naming any athlete's id would open that athlete's records to them.
 * Ids they do not coach are refused like ids that are no athletes at all, revealing nothing.
 */
function requireCoached(ctx: OrgCommandCtx, added: string[]): void {
  if (ctx.actor.roles.includes('admin')) return;
  if (added.some((id) => !ctx.actor.coachOf.includes(id)))
    throw new AppError('validation_failed', 'Please check the form: athleteIds must all be athletes you coach.', {
      athleteIds: ['must all be athletes you coach; an admin can add others'],
    });
}

async function insertMembers(ctx: OrgCommandCtx, groupId: string, ids: string[], role: 'coach' | 'athlete') {
  if (ids.length === 0) return;
  await ctx.m.insert(
    GroupMember,
    ids.map((memberId) => ({ groupId, memberId, role, organizationId: ctx.actor.organizationId })),
  );
}

async function dto(ctx: OrgCommandCtx, id: string): Promise<GroupDto> {
  return (await groupDtos(ctx.m, [await ctx.m.findOneByOrFail(Group, { id })], ctx.ability))[0];
}

/** Loads a group the actor may change; an archived group is kept for the record and changes no more. */
async function changeableGroup(ctx: OrgCommandCtx, id: string): Promise<{ group: Group; members: GroupMembers }> {
  const found = await readableGroup(ctx.m, ctx.actor, ctx.ability, id);
  authorize(ctx.ability, 'update', 'Group', groupSubject(found.group, found.members));
  if (found.group.archived) throw new AppError('conflict', 'That group is archived and can no longer be changed.');
  return found;
}

const minus = (a: string[], b: string[]) => a.filter((x) => !b.includes(x));
const sameSet = (a: string[], b: string[]) => a.length === b.length && minus(a, b).length === 0;
const onlyAdminsSetCoaches = () =>
  new AppError('forbidden', "Only an admin of your organization can choose a group's coaches.", {
    coachIds: ['can only be set by an admin'],
  });

export const createGroup = orgCommand({
  name: 'groups.create',
  changesLimits: true,
  async run(ctx, input: GroupCreateInput): Promise<GroupDto> {
    const org = ctx.actor.organizationId;
    const admin = ctx.actor.roles.includes('admin');
    const self = ctx.actor.roles.includes('coach') ? [ctx.actor.membershipId] : [];
    // A coach who starts a group is its coach; naming anyone else as coach is an admin's decision.
    if (input.coachIds && !admin && !sameSet(input.coachIds, self)) throw onlyAdminsSetCoaches();
    const coachIds = input.coachIds ?? self;
    authorize(ctx.ability, 'create', 'Group', { id: '', organizationId: org, coachIds, athleteIds: input.athleteIds });
    await requireMembers(ctx, coachIds, 'coach', 'coachIds');
    await requireMembers(ctx, input.athleteIds, 'athlete', 'athleteIds');
    requireCoached(ctx, input.athleteIds);
    let group: Group;
    try {
      group = await ctx.m.save(ctx.m.create(Group, { organizationId: org, name: input.name, kind: input.kind, createdBy: ctx.userId }));
    } catch (err) {
      if (isUniqueViolation(err)) throw new AppError('conflict', DUPLICATE, { name: ['is already the name of a group'] });
      throw err;
    }
    await insertMembers(ctx, group.id, coachIds, 'coach');
    await insertMembers(ctx, group.id, input.athleteIds, 'athlete');
    await ctx.audit({
      action: 'group.created',
      subjectType: 'Group',
      subjectId: group.id,
      after: { name: input.name, kind: input.kind, coachIds, athleteIds: input.athleteIds },
    });
    if (coachIds.length && input.athleteIds.length)
      await ctx.limitsChanged({ athleteIds: input.athleteIds, reason: 'The athlete joined a group with coaches.' });
    else ctx.limitsUnchanged();
    return dto(ctx, group.id);
  },
});

export const updateGroup = orgCommand({
  name: 'groups.update',
  async run(ctx, input: { id: string; name?: string; kind?: GroupKind; version: number }): Promise<GroupDto> {
    const { group } = await changeableGroup(ctx, input.id);
    const changes: Record<string, unknown> = { updatedAt: () => 'now()' };
    if (input.name !== undefined) changes.name = input.name;
    if (input.kind !== undefined) changes.kind = input.kind;
    try {
      await updateVersioned(ctx.m, Group, group.id, input.version, changes, 'group');
    } catch (err) {
      if (isUniqueViolation(err)) throw new AppError('conflict', DUPLICATE, { name: ['is already the name of a group'] });
      throw err;
    }
    await ctx.audit({
      action: 'group.updated',
      subjectType: 'Group',
      subjectId: group.id,
      before: { name: group.name, kind: group.kind },
      after: { name: input.name ?? group.name, kind: input.kind ?? group.kind, version: input.version + 1 },
    });
    return dto(ctx, group.id);
  },
});

export const setGroupMembers = orgCommand({
  name: 'groups.set_members',
  changesLimits: true,
  async run(ctx, input: GroupMembersInput & { id: string }): Promise<GroupDto> {
    const { group, members } = await changeableGroup(ctx, input.id);
    const coachesChanged = !sameSet(input.coachIds, members.coachIds);
    if (coachesChanged && !ctx.actor.roles.includes('admin')) throw onlyAdminsSetCoaches();
    await requireMembers(ctx, minus(input.coachIds, members.coachIds), 'coach', 'coachIds');
    await requireMembers(ctx, minus(input.athleteIds, members.athleteIds), 'athlete', 'athleteIds');
    requireCoached(ctx, minus(input.athleteIds, members.athleteIds));
    await updateVersioned(ctx.m, Group, group.id, input.version, { updatedAt: () => 'now()' }, 'group');

    // Rows of members no longer active are not on `members`: replace both lists whole.
    await ctx.m.delete(GroupMember, { groupId: group.id });
    await insertMembers(ctx, group.id, input.coachIds, 'coach');
    await insertMembers(ctx, group.id, input.athleteIds, 'athlete');
    const added = minus(input.athleteIds, members.athleteIds);
    const removed = minus(members.athleteIds, input.athleteIds);
    await onGroupAthletesChanged(ctx.m, { organizationId: group.organizationId, groupId: group.id, added, removed, today: ctx.today });
    await ctx.audit({
      action: 'group.members_changed',
      subjectType: 'Group',
      subjectId: group.id,
      before: { coachIds: members.coachIds, athleteIds: members.athleteIds },
      after: { coachIds: input.coachIds, athleteIds: input.athleteIds, version: input.version + 1 },
    });
    // Whose coaches changed: everyone who joined or left, and every athlete when the coaches did.
    const affected = [...new Set(coachesChanged ? [...members.athleteIds, ...input.athleteIds] : [...added, ...removed])];
    if (affected.length) await ctx.limitsChanged({ athleteIds: affected, reason: "The athlete's group or its coaches changed." });
    else ctx.limitsUnchanged();
    return dto(ctx, group.id);
  },
});

export const archiveGroup = orgCommand({
  name: 'groups.archive',
  changesLimits: true,
  async run(ctx, input: { id: string; version: number }): Promise<GroupDto> {
    const { group, members } = await changeableGroup(ctx, input.id);
    await updateVersioned(ctx.m, Group, group.id, input.version, { archived: true, updatedAt: () => 'now()' }, 'group');
    await ctx.audit({
      action: 'group.archived',
      subjectType: 'Group',
      subjectId: group.id,
      before: { name: group.name },
      after: { archived: true, version: input.version + 1 },
    });
    // Its coaches no longer coach its athletes through it.
    if (members.coachIds.length && members.athleteIds.length)
      await ctx.limitsChanged({ athleteIds: members.athleteIds, reason: "The athlete's group was archived." });
    else ctx.limitsUnchanged();
    return dto(ctx, group.id);
  },
});
