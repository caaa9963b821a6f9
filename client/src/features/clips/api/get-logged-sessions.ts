import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TrainingLogDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { addDaysIso, todayLocal } from '../../../lib/dates';
import { queryKeys } from '../../../lib/query-keys';

/** How far back a clip's session can be picked from. */
export const CLIP_SESSION_DAYS = 28;

/**
 * The athlete's logged sessions a clip can belong to. Same key and call as the training-log
 * feature's list, so both share one cached answer.
 */
export function loggedSessionsQueryOptions(orgId: string, athleteId: string, today = todayLocal()) {
  const range = { from: addDaysIso(today, -(CLIP_SESSION_DAYS - 1)), to: today };
  return queryOptions({
    queryKey: queryKeys.trainingLogs(orgId, athleteId, range),
    queryFn: () => api.get<TrainingLogDto[]>(`/orgs/${orgId}/training-logs`, { query: { athleteId, ...range } }),
  });
}

export function useLoggedSessions(orgId: string, athleteId: string) {
  return useQuery(loggedSessionsQueryOptions(orgId, athleteId));
}

/** Each exercise of a session once, in the order it was done. */
export function sessionExercises(log: Pick<TrainingLogDto, 'sets'>): string[] {
  return [...new Set(log.sets.map((s) => s.exercise))];
}
