import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LetterDto } from '../../../../../policies/dto';
import type { LetterCreateInput, LetterUpdateInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export function createLetter(orgId: string, input: LetterCreateInput): Promise<LetterDto> {
  return api.post<LetterDto>(`/orgs/${orgId}/letters`, input);
}

export function updateLetter(orgId: string, letterId: string, input: LetterUpdateInput): Promise<LetterDto> {
  return api.patch<LetterDto>(`/orgs/${orgId}/letters/${letterId}`, input);
}

export function useCreateLetter(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: LetterCreateInput) => createLetter(orgId, input),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: queryKeys.lettersAll(orgId) }),
  });
}

export function useUpdateLetter(orgId: string, letterId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: LetterUpdateInput) => updateLetter(orgId, letterId, input),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: queryKeys.lettersAll(orgId) }),
  });
}
