import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { StageCriteriaDto } from '../../../../../policies/dto';
import type { ReadinessRatingInput, StageAdvanceInput, StageAssessmentInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

/** Under the plan's own key, so anything that refreshes the plan refreshes its criteria too. */
export const stageCriteriaKey = (orgId: string, planId: string) => [...queryKeys.plan(orgId, planId), 'stage-criteria'] as const;

export function useStageCriteria(orgId: string, planId: string) {
  return useQuery({
    queryKey: stageCriteriaKey(orgId, planId),
    queryFn: () => api.get<StageCriteriaDto>(`/orgs/${orgId}/plans/${planId}/stage-criteria`),
  });
}

function useStageWrite<I>(orgId: string, planId: string, path: string, planChanges = false) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: I) => api.post<StageCriteriaDto>(`/orgs/${orgId}/plans/${planId}/${path}`, input),
    onSuccess: (dto) => {
      queryClient.setQueryData(stageCriteriaKey(orgId, planId), dto);
      void queryClient.invalidateQueries({ queryKey: queryKeys.audit(orgId) });
      if (planChanges) {
        void queryClient.invalidateQueries({ queryKey: queryKeys.plan(orgId, planId) });
        void queryClient.invalidateQueries({ queryKey: queryKeys.inForceAll(orgId) });
        void queryClient.invalidateQueries({ queryKey: queryKeys.caseload(orgId) });
        void queryClient.invalidateQueries({ queryKey: queryKeys.lettersAll(orgId) });
      }
    },
  });
}

export const useRecordAssessment = (orgId: string, planId: string) =>
  useStageWrite<StageAssessmentInput>(orgId, planId, 'stage-assessments');
export const useRateReadiness = (orgId: string, planId: string) => useStageWrite<ReadinessRatingInput>(orgId, planId, 'readiness');
export const useAdvanceStage = (orgId: string, planId: string) => useStageWrite<StageAdvanceInput>(orgId, planId, 'advance', true);
