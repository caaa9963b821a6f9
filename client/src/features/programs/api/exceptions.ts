import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ExceptionDto } from '../../../../../policies/dto';
import type { ExceptionCreateInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { refreshAfterProgramChange } from './get-programs';
import { programKeys } from './keys';

/** Every exception request on the reader's athletes, newest first (the builder marks sets with them). */
export function getExceptions(orgId: string): Promise<ExceptionDto[]> {
  return api.get<ExceptionDto[]>(`/orgs/${orgId}/exceptions`, { query: { state: 'all' } });
}

export function getExceptionsQueryOptions(orgId: string) {
  return queryOptions({ queryKey: programKeys.exceptions(orgId), queryFn: () => getExceptions(orgId) });
}

export function useExceptions(orgId: string, enabled = true) {
  return useQuery({ ...getExceptionsQueryOptions(orgId), enabled });
}

export function requestException(orgId: string, sessionId: string, input: ExceptionCreateInput): Promise<ExceptionDto> {
  return api.post<ExceptionDto>(`/orgs/${orgId}/sessions/${sessionId}/exceptions`, input);
}

export function useRequestException(orgId: string, sessionId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ExceptionCreateInput) => requestException(orgId, sessionId, input),
    onSuccess: () => refreshAfterProgramChange(queryClient, orgId),
  });
}
