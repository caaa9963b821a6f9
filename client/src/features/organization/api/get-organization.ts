import { queryOptions, useQuery } from '@tanstack/react-query';
import type { OrganizationDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export function getOrganization(orgId: string): Promise<OrganizationDto> {
  return api.get<OrganizationDto>(`/orgs/${orgId}`);
}

export function getOrganizationQueryOptions(orgId: string) {
  return queryOptions({
    queryKey: queryKeys.organization(orgId),
    queryFn: () => getOrganization(orgId),
    staleTime: 5 * 60_000,
  });
}

export function useOrganization(orgId: string) {
  return useQuery(getOrganizationQueryOptions(orgId));
}
