import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { OrganizationSettingsDto } from '../../../../../policies/dto';
import type { OrganizationSettingsInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { sessionQueryKey } from '../../../lib/query-client';
import { queryKeys } from '../../../lib/query-keys';

/** The organization's settings with their version, for its admins. */
export function getOrganizationSettings(orgId: string): Promise<OrganizationSettingsDto> {
  return api.get<OrganizationSettingsDto>(`/orgs/${orgId}/settings`);
}

export function getOrganizationSettingsQueryOptions(orgId: string) {
  return queryOptions({ queryKey: queryKeys.organizationSettings(orgId), queryFn: () => getOrganizationSettings(orgId) });
}

export function useOrganizationSettings(orgId: string) {
  return useQuery(getOrganizationSettingsQueryOptions(orgId));
}

export function updateOrganizationSettings(orgId: string, input: OrganizationSettingsInput): Promise<OrganizationSettingsDto> {
  return api.patch<OrganizationSettingsDto>(`/orgs/${orgId}/settings`, input);
}

/**
 * The name and emergency number show on everyone's pages, the clips setting changes what guardians
 * are sent, and the time zone (which the session's memberships carry) moves every "today": all of
 * them are refreshed.
 */
export function useUpdateOrganizationSettings(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: OrganizationSettingsInput) => updateOrganizationSettings(orgId, input),
    onSuccess: (settings) => {
      queryClient.setQueryData(queryKeys.organizationSettings(orgId), settings);
      void queryClient.invalidateQueries({ queryKey: queryKeys.organization(orgId) });
      void queryClient.invalidateQueries({ queryKey: queryKeys.clipsAll(orgId) });
      void queryClient.invalidateQueries({ queryKey: queryKeys.audit(orgId) });
      void queryClient.invalidateQueries({ queryKey: sessionQueryKey });
    },
  });
}
