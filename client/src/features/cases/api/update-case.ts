import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CaseDetailDto, CaseDto } from '../../../../../policies/dto';
import type { CaseUpdateInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';
import { refreshAfterCaseChange } from './get-case';

export function updateCase(orgId: string, caseId: string, input: CaseUpdateInput): Promise<CaseDto> {
  return api.patch<CaseDto>(`/orgs/${orgId}/cases/${caseId}`, input);
}

export function useUpdateCase(orgId: string, caseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CaseUpdateInput) => updateCase(orgId, caseId, input),
    onSuccess: (updated) => {
      // The reply carries no status history; keep the one we have until the refetch lands.
      queryClient.setQueryData<CaseDetailDto>(queryKeys.case(orgId, caseId), (old) => ({ ...old, ...updated }));
      refreshAfterCaseChange(queryClient, orgId);
    },
  });
}
