import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { GuardianLinkDto } from '../../../../../policies/dto';
import type { GuardianLinkCreateInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { refreshAfterTeamChange } from './refresh';

export function linkGuardian(orgId: string, input: GuardianLinkCreateInput): Promise<GuardianLinkDto> {
  return api.post<GuardianLinkDto>(`/orgs/${orgId}/guardian-links`, input);
}

export function useLinkGuardian(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: GuardianLinkCreateInput) => linkGuardian(orgId, input),
    onSuccess: () => refreshAfterTeamChange(queryClient, orgId),
  });
}
