import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { refreshAfterTeamChange } from './refresh';

export function removeCareTeamAssignment(orgId: string, assignmentId: string): Promise<void> {
  return api.delete(`/orgs/${orgId}/care-team/${assignmentId}`);
}

export function useRemoveCareTeamAssignment(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (assignmentId: string) => removeCareTeamAssignment(orgId, assignmentId),
    onSettled: () => refreshAfterTeamChange(queryClient, orgId),
  });
}
