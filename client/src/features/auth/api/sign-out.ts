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
    // A shared phone keeps nobody's records after a sign-out: the offline copies and outboxes go as soon
    // as it is asked for, so a page closed or left before the server answers cannot bring them back
    // (and with them the last person's screens) on the next start.
    onMutate: () => {
      clearOfflineCopies();
      clearAllOutboxes();
    },
    onSuccess: (session) => {
      queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== sessionQueryKey[0] });
      queryClient.setQueryData(sessionQueryKey, session);
    },
  });
}
