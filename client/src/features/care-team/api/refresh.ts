import type { QueryClient } from '@tanstack/react-query';
import { queryKeys } from '../../../lib/query-keys';
import { sessionQueryKey } from '../../../lib/query-client';

/**
 * Care teams and guardian links change who may see whom: people, athletes and the session's actor
 * (an admin may have put themselves on a team) all need a fresh copy.
 */
export function refreshAfterTeamChange(queryClient: QueryClient, orgId: string): void {
  void queryClient.invalidateQueries({ queryKey: queryKeys.people(orgId) });
  void queryClient.invalidateQueries({ queryKey: queryKeys.athletes(orgId) });
  void queryClient.invalidateQueries({ queryKey: sessionQueryKey });
}
