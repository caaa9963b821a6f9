import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PlanDto } from '../../../../../policies/dto';
import type { PlanCreateInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { refreshAfterPlanChange } from './get-plan';

export function createPlan(orgId: string, caseId: string, input: PlanCreateInput): Promise<PlanDto> {
  return api.post<PlanDto>(`/orgs/${orgId}/cases/${caseId}/plan`, input);
}

export function useCreatePlan(orgId: string, caseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: PlanCreateInput) => createPlan(orgId, caseId, input),
    onSuccess: (plan) => refreshAfterPlanChange(queryClient, orgId, plan),
  });
}
