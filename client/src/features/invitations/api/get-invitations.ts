import { queryOptions, useQuery } from '@tanstack/react-query';
import type { InvitationDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export function getInvitations(orgId: string): Promise<InvitationDto[]> {
  return api.get<InvitationDto[]>(`/orgs/${orgId}/invitations`);
}

export function getInvitationsQueryOptions(orgId: string) {
  return queryOptions({ queryKey: queryKeys.invitations(orgId), queryFn: () => getInvitations(orgId) });
}

export function useInvitations(orgId: string) {
  return useQuery(getInvitationsQueryOptions(orgId));
}
