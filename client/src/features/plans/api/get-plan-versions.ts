import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PlanVersionDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

/** Every saved version, newest first (care team only). */
export function getPlanVersions(orgId: string, planId: string): Promise<PlanVersionDto[]> {
  return api.get<PlanVersionDto[]>(`/orgs/${orgId}/plans/${planId}/versions`);
}

export function getPlanVersionsQueryOptions(orgId: string, planId: string) {
  return queryOptions({ queryKey: queryKeys.planVersions(orgId, planId), queryFn: () => getPlanVersions(orgId, planId) });
}

export function usePlanVersions(orgId: string, planId: string) {
  return useQuery(getPlanVersionsQueryOptions(orgId, planId));
}
