import { queryOptions, useQuery } from '@tanstack/react-query';
import type { WorkloadDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

/** Daily and weekly load, monotony and strain, the acute:chronic description, pain against load, e1RM. */
export function getWorkload(orgId: string, athleteId: string, to: string, days: number): Promise<WorkloadDto> {
  return api.get<WorkloadDto>(`/orgs/${orgId}/athletes/${athleteId}/workload`, { query: { to, days } });
}

export function getWorkloadQueryOptions(orgId: string, athleteId: string, to: string, days: number) {
  return queryOptions({
    queryKey: queryKeys.workload(orgId, athleteId, to, days),
    queryFn: () => getWorkload(orgId, athleteId, to, days),
  });
}

export function useWorkload(orgId: string, athleteId: string, to: string, days: number) {
  return useQuery(getWorkloadQueryOptions(orgId, athleteId, to, days));
}
