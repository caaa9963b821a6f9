import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RosterRowDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { programKeys } from './keys';

/** Each athlete the reader may see: status, limits today, sessions on hold, pending exceptions, next session. */
export function getRoster(orgId: string): Promise<RosterRowDto[]> {
  return api.get<RosterRowDto[]>(`/orgs/${orgId}/roster`);
}

export function getRosterQueryOptions(orgId: string) {
  return queryOptions({ queryKey: programKeys.roster(orgId), queryFn: () => getRoster(orgId) });
}

export function useRoster(orgId: string) {
  return useQuery(getRosterQueryOptions(orgId));
}
