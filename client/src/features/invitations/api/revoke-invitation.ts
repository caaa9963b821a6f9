import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export function revokeInvitation(orgId: string, invitationId: string): Promise<void> {
  return api.delete(`/orgs/${orgId}/invitations/${invitationId}`);
}

export function useRevokeInvitation(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: string) => revokeInvitation(orgId, invitationId),
    onSettled: () => queryClient.invalidateQueries({ queryKey: queryKeys.invitations(orgId) }),
  });
}
