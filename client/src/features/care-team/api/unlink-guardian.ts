import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { refreshAfterTeamChange } from './refresh';

export function unlinkGuardian(orgId: string, linkId: string): Promise<void> {
  return api.delete(`/orgs/${orgId}/guardian-links/${linkId}`);
}

export function useUnlinkGuardian(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (linkId: string) => unlinkGuardian(orgId, linkId),
    onSettled: () => refreshAfterTeamChange(queryClient, orgId),
  });
}
