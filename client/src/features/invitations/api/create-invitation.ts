import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InvitationDto } from '../../../../../policies/dto';
import type { InvitationCreateInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export function createInvitation(orgId: string, input: InvitationCreateInput): Promise<InvitationDto> {
  return api.post<InvitationDto>(`/orgs/${orgId}/invitations`, input);
}

export function useCreateInvitation(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: InvitationCreateInput) => createInvitation(orgId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: queryKeys.invitations(orgId) }),
  });
}
