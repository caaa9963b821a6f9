import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { CalendarFeedDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';

/** The member's own private calendar feed in one organization (server/src/routes/exports/calendar-feed.router.ts). */
export const calendarFeedQueryKey = (orgId: string) => ['orgs', orgId, 'calendar-feed'] as const;

export function getCalendarFeedQueryOptions(orgId: string) {
  return queryOptions({
    queryKey: calendarFeedQueryKey(orgId),
    queryFn: () => api.get<CalendarFeedDto>(`/orgs/${encodeURIComponent(orgId)}/calendar-feed`),
  });
}

export function useCalendarFeed(orgId: string) {
  return useQuery(getCalendarFeedQueryOptions(orgId));
}

/** Turns the feed on, or makes a new address (ending the old one). The answer holds the address, once. */
export function useStartCalendarFeed(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<CalendarFeedDto>(`/orgs/${encodeURIComponent(orgId)}/calendar-feed`),
    onSuccess: (feed) => queryClient.setQueryData(calendarFeedQueryKey(orgId), { on: feed.on, since: feed.since }),
  });
}

export function useStopCalendarFeed(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.delete<CalendarFeedDto>(`/orgs/${encodeURIComponent(orgId)}/calendar-feed`),
    onSuccess: (feed) => queryClient.setQueryData(calendarFeedQueryKey(orgId), feed),
  });
}
