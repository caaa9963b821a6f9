import { In, type EntityManager } from 'typeorm';
import { asSubject, type AppAbility } from '../../../policies/access';
import type { GroupDto } from '../../../policies/dto/teams';
import { orgQuery } from '../core/command';
import { authorize } from '../core/authorize';
import { Group } from '../entities';
import type { ActorWithOrg } from '../services/actor';
import { memberNames } from './members';
import { managerOf } from './programs';

/** Groups as their admins, coaches and the clinicians of their athletes read them (policies/access/group.ts). */

export interface GroupMembers {
  coachIds: string[];
  athleteIds: string[];
}

/** Everyone on the group's lists, active or not (a member who left still shows until someone takes them off). */
export async function groupMembers(m: EntityManager, groupIds: string[]): Promise<Map<string, GroupMembers>> {
  const out = new Map<string, GroupMembers>(groupIds.map((id) => [id, { coachIds: [], athleteIds: [] }]));
  if (groupIds.length === 0) return out;
  const rows: { group_id: string; member_id: string; role: 'coach' | 'athlete' }[] = await m.query(
    `SELECT gm.group_id, gm.member_id, gm.role FROM group_members gm
       JOIN memberships ms ON ms.id = gm.member_id AND ms.active
      WHERE gm.group_id = ANY($1::uuid[]) ORDER BY gm.created_at, gm.member_id`,
    [groupIds],
  );
  for (const r of rows) {
    const g = out.get(r.group_id)!;
    (r.role === 'coach' ? g.coachIds : g.athleteIds).push(r.member_id);
  }
  return out;
}

/** The group as a CASL subject, with its members' ids, for `authorize` and `ability.can`. */
export function groupSubject(group: Group, members: GroupMembers) {
  return { id: group.id, organizationId: group.organizationId, coachIds: members.coachIds, athleteIds: members.athleteIds };
}

export async function groupDtos(m: EntityManager, groups: Group[], ability: AppAbility): Promise<GroupDto[]> {
  const members = await groupMembers(
    m,
    groups.map((g) => g.id),
  );
  const names = await memberNames(
    m,
    [...members.values()].flatMap((g) => [...g.coachIds, ...g.athleteIds]),
  );
  const people = (ids: string[]) =>
    ids.map((id) => ({ id, name: names.get(id) ?? 'A member' })).sort((a, b) => a.name.localeCompare(b.name));
  return groups.map((g) => {
    const mine = members.get(g.id)!;
    const canManage = !g.archived && ability.can('update', asSubject('Group', groupSubject(g, mine)) as never);
    return {
      id: g.id,
      name: g.name,
      kind: g.kind,
      coaches: people(mine.coachIds),
      athletes: people(mine.athleteIds),
      canManage,
      // Who coaches a group decides who sees its athletes: an organization-wide decision, like a care
      // team, so only someone who may change a group they do not coach (an admin) sets its coaches.
      canSetCoaches: canManage && ability.can('update', asSubject('Group', { ...groupSubject(g, mine), coachIds: [] }) as never),
      archived: g.archived,
      version: g.version,
    };
  });
}

/** Loads a group of the actor's organization the actor may read, or answers 404. */
export async function readableGroup(
  m: EntityManager,
  actor: ActorWithOrg,
  ability: AppAbility,
  id: string,
): Promise<{ group: Group; members: GroupMembers }> {
  const group = await m.findOne(Group, { where: { id, organizationId: actor.organizationId } });
  const members = group ? (await groupMembers(m, [group.id])).get(group.id)! : null;
  authorize(ability, 'read', 'Group', group && members ? groupSubject(group, members) : null);
  return { group: group!, members: members! };
}

export const listGroups = orgQuery({
  name: 'groups.list',
  async run(ctx, input: { archived?: 'true' | 'false' }): Promise<GroupDto[]> {
    const { actor } = ctx;
    const m = managerOf(ctx.db);
    // The rules of policies/access/group.ts in SQL (CASL conditions on the member lists do not map to
    // columns): admins all; a coach the groups they coach; a clinician those holding an athlete in their care.
    const ids: { id: string }[] = await m.query(
      `SELECT g.id FROM groups g
        WHERE g.organization_id = $1 AND ($2 OR NOT g.archived)
          AND ($3 OR EXISTS (SELECT 1 FROM group_members gm WHERE gm.group_id = g.id AND (
                ($4 AND gm.role = 'coach' AND gm.member_id = $5) OR ($6 AND gm.role = 'athlete' AND gm.member_id = ANY($7::uuid[])))))
        ORDER BY g.archived, lower(g.name)`,
      [
        actor.organizationId,
        input.archived === 'true',
        actor.roles.includes('admin'),
        actor.roles.includes('coach'),
        actor.membershipId,
        actor.roles.includes('clinician'),
        actor.clinicianOf,
      ],
    );
    if (ids.length === 0) return [];
    const groups = await m.find(Group, { where: { id: In(ids.map((r) => r.id)) } });
    const order = new Map(ids.map((r, i) => [r.id, i]));
    groups.sort((a, b) => order.get(a.id)! - order.get(b.id)!);
    return groupDtos(m, groups, ctx.ability);
  },
});

export const getGroup = orgQuery({
  name: 'groups.get',
  async run(ctx, input: { id: string }): Promise<GroupDto> {
    const m = managerOf(ctx.db);
    const { group } = await readableGroup(m, ctx.actor, ctx.ability, input.id);
    return (await groupDtos(m, [group], ctx.ability))[0];
  },
});
