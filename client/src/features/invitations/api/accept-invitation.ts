import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SessionDto } from '../../../../../policies/dto';
import type { InvitationAcceptInput } from '../../../../../policies/schemas';
import { api, setCsrfToken } from '../../../lib/api-client';
import { sessionQueryKey } from '../../../lib/query-client';
import { PREVIEW_KEY } from './preview-invitation';

export async function acceptInvitation(input: InvitationAcceptInput): Promise<SessionDto> {
  const session = await api.post<SessionDto>('/invitations/accept', input);
  setCsrfToken(session.csrfToken);
  return session;
}

export function useAcceptInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: acceptInvitation,
    onSuccess: (session) => {
      // Drop what a previous person may have cached; the preview stays, since the page still shows it
      // until it navigates away, and asking again would find the token already used.
      queryClient.removeQueries({
        predicate: (query) => query.queryKey[0] !== sessionQueryKey[0] && query.queryKey[0] !== PREVIEW_KEY,
      });
      queryClient.setQueryData(sessionQueryKey, session);
    },
  });
}
