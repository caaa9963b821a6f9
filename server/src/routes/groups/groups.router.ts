import { NothingSchema, OrgItemParamsSchema, OrgParamsSchema } from '../../../../policies/schemas';
import {
  GroupArchiveSchema,
  GroupCreateSchema,
  GroupListQuerySchema,
  GroupMembersSchema,
  GroupUpdateSchema,
} from '../../../../policies/schemas/groups';
import { archiveGroup, createGroup, setGroupMembers, updateGroup } from '../../commands/groups';
import { orgRoute, type RouteDef } from '../../http/route';
import { changeItem, createFromBody, readItem, readList } from '../../http/route-handlers';
import { getGroup, listGroups } from '../../queries/groups';

/**
 * Groups (a team, a position group, a training block): admins keep all of them, a coach the ones
 * they coach, and clinicians read those holding an athlete in their care (policies/access/group.ts).
 */
const read = { kind: 'org', action: 'read', subject: 'Group' } as const;
const update = { kind: 'org', action: 'update', subject: 'Group' } as const;

export const groupRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/groups',
    summary: 'Groups I may see: all for admins, the ones I coach, the ones my patients train in',
    access: read,
    params: OrgParamsSchema,
    query: GroupListQuerySchema,
    body: NothingSchema,
    ...readList(listGroups),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/groups',
    summary: 'Start a group (a coach who starts one is its coach)',
    access: { kind: 'org', action: 'create', subject: 'Group' },
    params: OrgParamsSchema,
    query: NothingSchema,
    body: GroupCreateSchema,
    status: 201,
    ...createFromBody(createGroup),
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/groups/:id',
    summary: 'A group with its coaches and athletes',
    access: read,
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    ...readItem(getGroup),
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/groups/:id',
    summary: 'Rename a group or change its kind',
    access: update,
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: GroupUpdateSchema,
    ...changeItem(updateGroup),
  }),
  orgRoute({
    method: 'put',
    path: '/orgs/:orgId/groups/:id/members',
    summary: "Set a group's athletes (and, for admins, its coaches); access follows at once",
    access: update,
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: GroupMembersSchema,
    ...changeItem(setGroupMembers),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/groups/:id/archive',
    summary: 'Archive a group: kept for the record, nobody coaches through it any more',
    access: update,
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: GroupArchiveSchema,
    ...changeItem(archiveGroup),
  }),
];
