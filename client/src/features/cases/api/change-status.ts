import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CaseDetailDto } from '../../../../../policies/dto';
import type { StatusChangeInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';
import { refreshAfterCaseChange } from './get-case';

export function changeStatus(orgId: string, caseId: string, input: StatusChangeInput): Promise<CaseDetailDto> {
  return api.post<CaseDetailDto>(`/orgs/${orgId}/cases/${caseId}/status`, input);
}

export function useChangeStatus(orgId: string, caseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: StatusChangeInput) => changeStatus(orgId, caseId, input),
    onSuccess: (detail) => {
      queryClient.setQueryData<CaseDetailDto>(queryKeys.case(orgId, caseId), (old) => ({ ...old, ...detail }));
      refreshAfterCaseChange(queryClient, orgId);
    },
  });
}
