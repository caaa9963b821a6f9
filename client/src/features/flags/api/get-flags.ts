import { queryOptions, useQuery } from '@tanstack/react-query';
import type { FlagDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export type FlagState = 'open' | 'acknowledged' | 'all';

/** Red-flag reports, pain reports and pain-rule flags of the reader's athletes, newest first. */
export function getFlags(orgId: string, filters: { athleteId?: string; state: FlagState }): Promise<FlagDto[]> {
  return api.get<FlagDto[]>(`/orgs/${orgId}/flags`, { query: filters });
}

export function getFlagsQueryOptions(orgId: string, filters: { athleteId?: string; state: FlagState }) {
  return queryOptions({ queryKey: queryKeys.flags(orgId, filters), queryFn: () => getFlags(orgId, filters), refetchInterval: 60_000 });
}

export function useFlags(orgId: string, filters: { athleteId?: string; state: FlagState }) {
  return useQuery(getFlagsQueryOptions(orgId, filters));
}
