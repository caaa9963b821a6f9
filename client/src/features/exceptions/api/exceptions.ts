import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ExceptionDto } from '../../../../../policies/dto';
import type { ExceptionDecisionInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';

/**
 * Keys shared with the programs feature (same shape, same cache entries): a decision there shows up
 * in the builder's set marks, the roster's counts and the program's holds.
 */
export const exceptionKeys = {
  list: (orgId: string) => ['orgs', orgId, 'exceptions'] as const,
  programs: (orgId: string) => ['orgs', orgId, 'programs'] as const,
  athletePrograms: (orgId: string, athleteId: string) => ['orgs', orgId, 'programs', 'list', athleteId] as const,
  exercises: (orgId: string) => ['orgs', orgId, 'exercises'] as const,
  roster: (orgId: string) => ['orgs', orgId, 'roster'] as const,
};

/** Every exception request on the reader's athletes, newest first. */
export function getExceptions(orgId: string): Promise<ExceptionDto[]> {
  return api.get<ExceptionDto[]>(`/orgs/${orgId}/exceptions`, { query: { state: 'all' } });
}

export function getExceptionsQueryOptions(orgId: string) {
  return queryOptions({ queryKey: exceptionKeys.list(orgId), queryFn: () => getExceptions(orgId) });
}

export function useExceptionRequests(orgId: string) {
  return useQuery(getExceptionsQueryOptions(orgId));
}

export function decideException(orgId: string, id: string, input: ExceptionDecisionInput): Promise<ExceptionDto> {
  return api.post<ExceptionDto>(`/orgs/${orgId}/exceptions/${id}/decide`, input);
}

export function useDecideException(orgId: string, id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ExceptionDecisionInput) => decideException(orgId, id, input),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: exceptionKeys.list(orgId) });
      // A grant re-checks the athlete's published sessions on the server: holds may lift.
      void queryClient.invalidateQueries({ queryKey: exceptionKeys.programs(orgId) });
      void queryClient.invalidateQueries({ queryKey: exceptionKeys.roster(orgId) });
    },
  });
}
