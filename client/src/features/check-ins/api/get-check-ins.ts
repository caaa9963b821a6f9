import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CheckInDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

/** An athlete's daily check-ins between two dates (inclusive), newest first. */
export function getCheckIns(orgId: string, athleteId: string, range: { from: string; to: string }): Promise<CheckInDto[]> {
  return api.get<CheckInDto[]>(`/orgs/${orgId}/check-ins`, { query: { athleteId, ...range } });
}

export function getCheckInsQueryOptions(orgId: string, athleteId: string, range: { from: string; to: string }) {
  return queryOptions({ queryKey: queryKeys.checkIns(orgId, athleteId, range), queryFn: () => getCheckIns(orgId, athleteId, range) });
}

export function useCheckIns(orgId: string, athleteId: string, range: { from: string; to: string }) {
  return useQuery(getCheckInsQueryOptions(orgId, athleteId, range));
}
