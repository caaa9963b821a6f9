import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CaseDetailDto, CaseDto } from '../../../../../policies/dto';
import type { CaseCloseInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';
import { refreshAfterCaseChange } from './get-case';

export function closeCase(orgId: string, caseId: string, input: CaseCloseInput): Promise<CaseDto> {
  return api.post<CaseDto>(`/orgs/${orgId}/cases/${caseId}/close`, input);
}

export function useCloseCase(orgId: string, caseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CaseCloseInput) => closeCase(orgId, caseId, input),
    onSuccess: (closed) => {
      queryClient.setQueryData<CaseDetailDto>(queryKeys.case(orgId, caseId), (old) => ({ ...old, ...closed }));
      refreshAfterCaseChange(queryClient, orgId);
    },
  });
}
