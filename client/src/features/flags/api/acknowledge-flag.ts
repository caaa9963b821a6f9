import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

/** "I have seen this and am acting on it." Recorded with who and when; acknowledging twice is harmless. */
export function acknowledgeFlag(orgId: string, flagId: string): Promise<void> {
  return api.post<void>(`/orgs/${orgId}/flags/${flagId}/acknowledge`);
}

export function useAcknowledgeFlag(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (flagId: string) => acknowledgeFlag(orgId, flagId),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: queryKeys.flagsAll(orgId) }),
  });
}
