import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LetterPrefillDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

/** The updated letter's form, filled in by the server from the status and limits in force today. */
export function getLetterPrefill(orgId: string, athleteId: string): Promise<LetterPrefillDto> {
  return api.get<LetterPrefillDto>(`/orgs/${orgId}/letters/prefill`, { query: { athleteId } });
}

export function getLetterPrefillQueryOptions(orgId: string, athleteId: string) {
  return queryOptions({
    queryKey: queryKeys.letterPrefill(orgId, athleteId),
    queryFn: () => getLetterPrefill(orgId, athleteId),
    staleTime: 0,
  });
}

export function useLetterPrefill(orgId: string, athleteId: string) {
  return useQuery(getLetterPrefillQueryOptions(orgId, athleteId));
}
