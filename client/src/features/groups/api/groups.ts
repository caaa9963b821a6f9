import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { GroupDto, TeamProgramDto, TeamProgramSummaryDto } from '../../../../../policies/dto/teams';
import type { GroupKind } from '../../../../../policies/schemas/groups';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';
import { sessionQueryKey } from '../../../lib/query-client';

/** Groups and the team programs written for them (server: routes/groups, routes/team-programs). */

export const groupKeys = {
  all: (orgId: string) => [...queryKeys.org(orgId), 'groups'] as const,
  one: (orgId: string, id: string) => [...queryKeys.org(orgId), 'groups', id] as const,
  teamPrograms: (orgId: string, groupId: string) => [...queryKeys.org(orgId), 'team-programs', { groupId }] as const,
};

export interface GroupCreateValues {
  name: string;
  kind: GroupKind;
  athleteIds: string[];
  coachIds?: string[];
}
export interface GroupMembersValues {
  coachIds: string[];
  athleteIds: string[];
  version: number;
}

export const groupsQueryOptions = (orgId: string) =>
  queryOptions({ queryKey: groupKeys.all(orgId), queryFn: () => api.get<GroupDto[]>(`/orgs/${orgId}/groups`) });

export function useGroups(orgId: string) {
  return useQuery(groupsQueryOptions(orgId));
}

export function useGroup(orgId: string, id: string) {
  return useQuery({ queryKey: groupKeys.one(orgId, id), queryFn: () => api.get<GroupDto>(`/orgs/${orgId}/groups/${id}`) });
}

export function useGroupTeamPrograms(orgId: string, groupId: string) {
  return useQuery({
    queryKey: groupKeys.teamPrograms(orgId, groupId),
    queryFn: () => api.get<TeamProgramSummaryDto[]>(`/orgs/${orgId}/team-programs?groupId=${encodeURIComponent(groupId)}`),
  });
}

/** After a change of who is in a group, who sees whom changed: the session's coachOf, rosters, athlete lists. */
function useAfterMembershipChange(orgId: string) {
  const queryClient = useQueryClient();
  return (group: GroupDto) => {
    queryClient.setQueryData(groupKeys.one(orgId, group.id), group);
    void queryClient.invalidateQueries({ queryKey: queryKeys.org(orgId) });
    void queryClient.invalidateQueries({ queryKey: sessionQueryKey });
  };
}

export function useCreateGroup(orgId: string) {
  const after = useAfterMembershipChange(orgId);
  return useMutation({
    mutationFn: (values: GroupCreateValues) => api.post<GroupDto>(`/orgs/${orgId}/groups`, values),
    onSuccess: after,
  });
}

export function useUpdateGroup(orgId: string, id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (values: { name?: string; kind?: GroupKind; version: number }) =>
      api.patch<GroupDto>(`/orgs/${orgId}/groups/${id}`, values),
    onSuccess: (group) => {
      queryClient.setQueryData(groupKeys.one(orgId, id), group);
      void queryClient.invalidateQueries({ queryKey: groupKeys.all(orgId) });
    },
  });
}

export function useSetGroupMembers(orgId: string, id: string) {
  const after = useAfterMembershipChange(orgId);
  return useMutation({
    mutationFn: (values: GroupMembersValues) => api.put<GroupDto>(`/orgs/${orgId}/groups/${id}/members`, values),
    onSuccess: after,
  });
}

export function useArchiveGroup(orgId: string, id: string) {
  const after = useAfterMembershipChange(orgId);
  return useMutation({
    mutationFn: (version: number) => api.post<GroupDto>(`/orgs/${orgId}/groups/${id}/archive`, { version }),
    onSuccess: after,
  });
}

export function useCreateTeamProgram(orgId: string, groupId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (name: string) => api.post<TeamProgramDto>(`/orgs/${orgId}/team-programs`, { groupId, name }),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: groupKeys.teamPrograms(orgId, groupId) }),
  });
}
