import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AthleteWeekDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { programKeys } from './keys';

/** The coming seven days from the organization's today: published sessions and the limits of each day. */
export function getWeek(orgId: string, athleteId: string): Promise<AthleteWeekDto> {
  return api.get<AthleteWeekDto>(`/orgs/${orgId}/athletes/${athleteId}/week`);
}

/** Keyed by today as well, so the week moves on at midnight in the organization's zone. */
export function getWeekQueryOptions(orgId: string, athleteId: string, today: string) {
  return queryOptions({ queryKey: programKeys.week(orgId, athleteId, today), queryFn: () => getWeek(orgId, athleteId) });
}

export function useWeek(orgId: string, athleteId: string, today: string) {
  return useQuery(getWeekQueryOptions(orgId, athleteId, today));
}
