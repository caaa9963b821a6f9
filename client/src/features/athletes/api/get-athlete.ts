import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AthleteProfileDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export function getAthlete(orgId: string, athleteId: string): Promise<AthleteProfileDto> {
  return api.get<AthleteProfileDto>(`/orgs/${orgId}/athletes/${athleteId}`);
}

export function getAthleteQueryOptions(orgId: string, athleteId: string) {
  return queryOptions({ queryKey: queryKeys.athlete(orgId, athleteId), queryFn: () => getAthlete(orgId, athleteId) });
}

export function useAthlete(orgId: string, athleteId: string) {
  return useQuery(getAthleteQueryOptions(orgId, athleteId));
}
