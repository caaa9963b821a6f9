import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TrainingLogDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

/** An athlete's logged sessions between two dates (inclusive), newest first. */
export function getTrainingLogs(orgId: string, athleteId: string, range: { from: string; to: string }): Promise<TrainingLogDto[]> {
  return api.get<TrainingLogDto[]>(`/orgs/${orgId}/training-logs`, { query: { athleteId, ...range } });
}

export function getTrainingLogsQueryOptions(orgId: string, athleteId: string, range: { from: string; to: string }) {
  return queryOptions({
    queryKey: queryKeys.trainingLogs(orgId, athleteId, range),
    queryFn: () => getTrainingLogs(orgId, athleteId, range),
  });
}

export function useTrainingLogs(orgId: string, athleteId: string, range: { from: string; to: string }) {
  return useQuery(getTrainingLogsQueryOptions(orgId, athleteId, range));
}
