import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TodayDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { programKeys } from './keys';

/** An athlete's published sessions for a day, loads worked out in kg, on-hold sessions marked. */
export function getToday(orgId: string, athleteId: string, date: string): Promise<TodayDto> {
  return api.get<TodayDto>(`/orgs/${orgId}/athletes/${athleteId}/today`, { query: { date } });
}

export function getTodayQueryOptions(orgId: string, athleteId: string, date: string) {
  return queryOptions({ queryKey: programKeys.today(orgId, athleteId, date), queryFn: () => getToday(orgId, athleteId, date) });
}

export function useToday(orgId: string, athleteId: string, date: string) {
  return useQuery(getTodayQueryOptions(orgId, athleteId, date));
}
