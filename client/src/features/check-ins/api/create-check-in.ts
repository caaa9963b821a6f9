import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CheckInDto } from '../../../../../policies/dto';
import type { CheckInInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

/** One check-in a day: sending another for the same date replaces it. */
export function createCheckIn(orgId: string, input: CheckInInput): Promise<CheckInDto> {
  return api.post<CheckInDto>(`/orgs/${orgId}/check-ins`, input);
}

export function useCreateCheckIn(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CheckInInput) => createCheckIn(orgId, input),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: queryKeys.checkInsAll(orgId) }),
  });
}
