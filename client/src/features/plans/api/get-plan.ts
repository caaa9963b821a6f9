import { queryOptions, useQueries, useQuery, type QueryClient } from '@tanstack/react-query';
import type { PlanDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export function getPlan(orgId: string, planId: string): Promise<PlanDto> {
  return api.get<PlanDto>(`/orgs/${orgId}/plans/${planId}`);
}

export function getPlanQueryOptions(orgId: string, planId: string) {
  return queryOptions({ queryKey: queryKeys.plan(orgId, planId), queryFn: () => getPlan(orgId, planId) });
}

export function usePlan(orgId: string, planId: string) {
  return useQuery(getPlanQueryOptions(orgId, planId));
}

/** Several plans at once, e.g. those of an athlete's open cases. */
export function usePlans(orgId: string, planIds: string[]) {
  return useQueries({ queries: planIds.map((id) => getPlanQueryOptions(orgId, id)) });
}

/** A saved plan moves what is in force, the case's plan link, review dates and the trail. */
export function refreshAfterPlanChange(queryClient: QueryClient, orgId: string, plan: PlanDto) {
  queryClient.setQueryData(queryKeys.plan(orgId, plan.id), plan);
  // The case links to its plan; say so without re-reading the case (each read is audited).
  queryClient.setQueryData<{ planId?: string | null }>(queryKeys.case(orgId, plan.caseId), (old) =>
    old ? { ...old, planId: plan.id } : old,
  );
  void queryClient.invalidateQueries({ queryKey: queryKeys.planVersions(orgId, plan.id) });
  // What hangs under the plan (its stage criteria, read against the plan's thresholds) is read again;
  // the plan itself was just set above.
  const planKeyLength = queryKeys.plan(orgId, plan.id).length;
  void queryClient.invalidateQueries({
    queryKey: queryKeys.plan(orgId, plan.id),
    predicate: (q) => q.queryKey.length > planKeyLength,
  });
  void queryClient.invalidateQueries({ queryKey: queryKeys.caseLists(orgId) });
  void queryClient.invalidateQueries({ queryKey: queryKeys.caseload(orgId) });
  void queryClient.invalidateQueries({ queryKey: queryKeys.inForceAll(orgId) });
  void queryClient.invalidateQueries({ queryKey: queryKeys.audit(orgId) });
  // A letter in force may now be out of date (worked out by the server on each read).
  void queryClient.invalidateQueries({ queryKey: queryKeys.lettersAll(orgId) });
}
