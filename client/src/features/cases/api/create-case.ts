import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CaseDto } from '../../../../../policies/dto';
import type { CaseCreateInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { refreshAfterCaseChange } from './get-case';

export function createCase(orgId: string, input: CaseCreateInput): Promise<CaseDto> {
  return api.post<CaseDto>(`/orgs/${orgId}/cases`, input);
}

export function useCreateCase(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CaseCreateInput) => createCase(orgId, input),
    onSuccess: () => refreshAfterCaseChange(queryClient, orgId),
  });
}
