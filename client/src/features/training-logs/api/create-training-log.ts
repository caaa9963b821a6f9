import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { TrainingLogOutcomeDto } from '../../../../../policies/dto';
import type { TrainingLogCreateInput } from '../../../../../policies/schemas';
import { sendOrKeep, useSignedInUserId } from '../../../lib/offline-queue';
import { queryKeys } from '../../../lib/query-keys';

/** A log moves the workload, and the pain rule may raise a flag and send notices. */
export function refreshAfterLog(queryClient: QueryClient, orgId: string) {
  for (const queryKey of [
    queryKeys.trainingLogsAll(orgId),
    queryKeys.workloadAll(orgId),
    queryKeys.flagsAll(orgId),
    queryKeys.notifications(orgId),
  ]) {
    void queryClient.invalidateQueries({ queryKey });
  }
}

/** Without signal the log is kept on the phone and sent later (lib/offline-queue.ts). */
export function useCreateTrainingLog(orgId: string) {
  const queryClient = useQueryClient();
  const userId = useSignedInUserId();
  return useMutation({
    // Runs without signal too: sendOrKeep keeps it on the phone then (react-query would only pause it).
    networkMode: 'always',
    mutationFn: (input: TrainingLogCreateInput) =>
      sendOrKeep<TrainingLogOutcomeDto>(userId, { orgId, kind: 'training_log', path: `/orgs/${orgId}/training-logs`, body: input }),
    onSuccess: () => refreshAfterLog(queryClient, orgId),
  });
}
