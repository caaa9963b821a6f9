import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CareTeamAssignmentDto } from '../../../../../policies/dto';
import type { CareTeamAssignmentCreateInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { refreshAfterTeamChange } from './refresh';

export function assignCareTeam(orgId: string, input: CareTeamAssignmentCreateInput): Promise<CareTeamAssignmentDto> {
  return api.post<CareTeamAssignmentDto>(`/orgs/${orgId}/care-team`, input);
}

export function useAssignCareTeam(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CareTeamAssignmentCreateInput) => assignCareTeam(orgId, input),
    onSuccess: () => refreshAfterTeamChange(queryClient, orgId),
  });
}
