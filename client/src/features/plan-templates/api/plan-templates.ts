import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { PlanTemplateDto, PlanTemplateSummaryDto } from '../../../../../policies/dto';
import type { PlanTemplateFromPlanInput, PlanTemplateUpdateInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';

/** Keys under the organization, so anything that refreshes the organization refreshes these too. */
const keys = {
  list: (orgId: string) => ['orgs', orgId, 'plan-templates'] as const,
  one: (orgId: string, id: string) => ['orgs', orgId, 'plan-templates', id] as const,
};

export const planTemplatesQueryOptions = (orgId: string) =>
  queryOptions({
    queryKey: keys.list(orgId),
    queryFn: () => api.get<PlanTemplateSummaryDto[]>(`/orgs/${orgId}/plan-templates`),
  });

export const planTemplateQueryOptions = (orgId: string, id: string) =>
  queryOptions({ queryKey: keys.one(orgId, id), queryFn: () => api.get<PlanTemplateDto>(`/orgs/${orgId}/plan-templates/${id}`) });

/** `enabled` false: nothing is fetched until the list is wanted. */
export function usePlanTemplates(orgId: string, enabled = true) {
  return useQuery({ ...planTemplatesQueryOptions(orgId), enabled });
}

/** Saves a case's plan, as it stands on the server, as a template of the organization. */
export function useSavePlanAsTemplate(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: PlanTemplateFromPlanInput) => api.post<PlanTemplateDto>(`/orgs/${orgId}/plan-templates/from-plan`, input),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: keys.list(orgId) }),
  });
}

export function useCopyPlanTemplate(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api.post<PlanTemplateDto>(`/orgs/${orgId}/plan-templates/${id}/copy`, {}),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: keys.list(orgId) }),
  });
}

export function usePlanTemplate(orgId: string, id: string) {
  return useQuery(planTemplateQueryOptions(orgId, id));
}

/** Changes a template against the version its editor saw (409 when someone saved since). */
export function useUpdatePlanTemplate(orgId: string, id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: PlanTemplateUpdateInput) => api.put<PlanTemplateDto>(`/orgs/${orgId}/plan-templates/${id}`, input),
    onSuccess: (dto) => {
      queryClient.setQueryData(keys.one(orgId, id), dto);
      void queryClient.invalidateQueries({ queryKey: keys.list(orgId), exact: true });
    },
  });
}

export function useArchivePlanTemplate(orgId: string, id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (version: number) => api.post<PlanTemplateDto>(`/orgs/${orgId}/plan-templates/${id}/archive`, { version }),
    onSuccess: (dto) => {
      queryClient.setQueryData(keys.one(orgId, id), dto);
      void queryClient.invalidateQueries({ queryKey: keys.list(orgId), exact: true });
    },
  });
}
