import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { TrainingLogOutcomeDto } from '../../../../../policies/dto';
import type { NextMorningInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { refreshAfterLog } from './create-training-log';

export function recordNextMorning(orgId: string, logId: string, input: NextMorningInput): Promise<TrainingLogOutcomeDto> {
  return api.post<TrainingLogOutcomeDto>(`/orgs/${orgId}/training-logs/${logId}/next-morning`, input);
}

export function useRecordNextMorning(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ logId, ...input }: NextMorningInput & { logId: string }) => recordNextMorning(orgId, logId, input),
    onSuccess: () => refreshAfterLog(queryClient, orgId),
  });
}
