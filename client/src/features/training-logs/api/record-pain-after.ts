import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { TrainingLogOutcomeDto } from '../../../../../policies/dto';
import type { PainAfterInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { refreshAfterLog } from './create-training-log';

export function recordPainAfter(orgId: string, logId: string, input: PainAfterInput): Promise<TrainingLogOutcomeDto> {
  return api.post<TrainingLogOutcomeDto>(`/orgs/${orgId}/training-logs/${logId}/after`, input);
}

export function useRecordPainAfter(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ logId, ...input }: PainAfterInput & { logId: string }) => recordPainAfter(orgId, logId, input),
    onSuccess: () => refreshAfterLog(queryClient, orgId),
  });
}
