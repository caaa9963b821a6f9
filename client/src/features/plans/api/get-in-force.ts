import { queryOptions, useQuery } from '@tanstack/react-query';
import type { InForceDto } from '../../../../../policies/dto';
import { api, isApiError } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

/** Status, stages and the rule per movement pattern in force for an athlete on a date. */
export function getInForce(orgId: string, athleteId: string, date: string): Promise<InForceDto> {
  return api.get<InForceDto>(`/orgs/${orgId}/athletes/${athleteId}/in-force`, { query: { date } });
}

export function getInForceQueryOptions(orgId: string, athleteId: string, date: string) {
  return queryOptions({ queryKey: queryKeys.inForce(orgId, athleteId, date), queryFn: () => getInForce(orgId, athleteId, date) });
}

export function useInForce(orgId: string, athleteId: string, date: string, enabled = true) {
  return useQuery({ ...getInForceQueryOptions(orgId, athleteId, date), enabled });
}

/** Not found or refused: the reader has no view of this athlete's limits, so the section is left out. */
export function isNoAccess(error: unknown): boolean {
  return isApiError(error) && (error.status === 403 || error.status === 404);
}
