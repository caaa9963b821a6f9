import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CheckInDto } from '../../../../../policies/dto';
import type { CheckInInput } from '../../../../../policies/schemas';
import { sendOrKeep, useSignedInUserId } from '../../../lib/offline-queue';
import { queryKeys } from '../../../lib/query-keys';

/**
 * One check-in a day: sending another for the same date replaces it. Without signal it is kept on the
 * phone and sent later (lib/offline-queue.ts).
 */
export function useCreateCheckIn(orgId: string) {
  const queryClient = useQueryClient();
  const userId = useSignedInUserId();
  return useMutation({
    // Runs without signal too: sendOrKeep keeps it on the phone then (react-query would only pause it).
    networkMode: 'always',
    mutationFn: (input: CheckInInput) =>
      sendOrKeep<CheckInDto>(userId, { orgId, kind: 'check_in', path: `/orgs/${orgId}/check-ins`, body: input }),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: queryKeys.checkInsAll(orgId) }),
  });
}
