import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PlanDto } from '../../../../../policies/dto';
import type { PlanUpdateInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { refreshAfterPlanChange } from './get-plan';

/** Saves a new version; the server answers 409 if someone saved after `input.version` was loaded. */
export function updatePlan(orgId: string, planId: string, input: PlanUpdateInput): Promise<PlanDto> {
  return api.put<PlanDto>(`/orgs/${orgId}/plans/${planId}`, input);
}

export function useUpdatePlan(orgId: string, planId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: PlanUpdateInput) => updatePlan(orgId, planId, input),
    onSuccess: (plan) => refreshAfterPlanChange(queryClient, orgId, plan),
  });
}
