import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SessionDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { clearOfflineCopies } from '../../../lib/offline-copy';
import { clearAllOutboxes } from '../../../lib/offline-queue';
import { sessionQueryKey } from '../../../lib/query-client';
import { getSession } from './get-session';

/** Ends the session, then asks for a fresh signed-out session (and with it a new CSRF token). */
export async function signOut(): Promise<SessionDto> {
  await api.delete('/session');
  return getSession();
}

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSuccess: (session) => {
      // A shared phone keeps nobody's records after a sign-out: the offline copies and outboxes go too.
      clearOfflineCopies();
      clearAllOutboxes();
      queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== sessionQueryKey[0] });
      queryClient.setQueryData(sessionQueryKey, session);
    },
  });
}
