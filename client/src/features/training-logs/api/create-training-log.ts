import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { TrainingLogOutcomeDto } from '../../../../../policies/dto';
import type { TrainingLogCreateInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export function createTrainingLog(orgId: string, input: TrainingLogCreateInput): Promise<TrainingLogOutcomeDto> {
  return api.post<TrainingLogOutcomeDto>(`/orgs/${orgId}/training-logs`, input);
}

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

export function useCreateTrainingLog(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: TrainingLogCreateInput) => createTrainingLog(orgId, input),
    onSuccess: () => refreshAfterLog(queryClient, orgId),
  });
}
