import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AthleteProfileDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

/** The athletes this person may see; the server filters (admin: all; others: the athletes around them). */
export function getAthletes(orgId: string): Promise<AthleteProfileDto[]> {
  return api.get<AthleteProfileDto[]>(`/orgs/${orgId}/athletes`);
}

export function getAthletesQueryOptions(orgId: string) {
  return queryOptions({ queryKey: queryKeys.athletes(orgId), queryFn: () => getAthletes(orgId) });
}

export function useAthletes(orgId: string) {
  return useQuery(getAthletesQueryOptions(orgId));
}
