import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CaseDto } from '../../../../../policies/dto';
import type { CaseCreateInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';
import { refreshAfterCaseChange } from './get-case';

export function createCase(orgId: string, input: CaseCreateInput): Promise<CaseDto> {
  return api.post<CaseDto>(`/orgs/${orgId}/cases`, input);
}

export function useCreateCase(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CaseCreateInput) => createCase(orgId, input),
    onSuccess: (_created, input) => {
      refreshAfterCaseChange(queryClient, orgId);
      // A case opened from a pain report is now that report's case.
      if (input.painReportId) void queryClient.invalidateQueries({ queryKey: queryKeys.painReportsAll(orgId) });
    },
  });
}
