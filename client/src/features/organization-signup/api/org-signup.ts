import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import type {
  OrganizationSignupConfirmedDto,
  OrganizationSignupRequestedDto,
  OrganizationSignupStatusDto,
} from '../../../../../policies/dto';
import type { OrganizationSignupConfirmInput, OrganizationSignupInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';

/** Not about any organization, so not under ['orgs', orgId]: whether this installation lets anyone start one. */
export const signupStatusKey = ['org-signup'] as const;

export function signupStatusQueryOptions() {
  return queryOptions({
    queryKey: signupStatusKey,
    queryFn: () => api.get<OrganizationSignupStatusDto>('/org-signup'),
    staleTime: 5 * 60_000,
  });
}

export function useSignupStatus() {
  return useQuery(signupStatusQueryOptions());
}

/** The server answers the same whether or not the address has an account. */
export function useRequestSignup() {
  return useMutation({ mutationFn: (input: OrganizationSignupInput) => api.post<OrganizationSignupRequestedDto>('/org-signup', input) });
}

export function useConfirmSignup() {
  return useMutation({
    mutationFn: (input: OrganizationSignupConfirmInput) => api.post<OrganizationSignupConfirmedDto>('/org-signup/confirm', input),
  });
}
