import { queryOptions, useQuery } from '@tanstack/react-query';
import type { NotificationDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

/** My notices in this organization, newest first. Polled, so an emergency notice shows up unasked. */
export function getNotifications(orgId: string): Promise<NotificationDto[]> {
  return api.get<NotificationDto[]>(`/orgs/${orgId}/notifications`);
}

export function getNotificationsQueryOptions(orgId: string) {
  return queryOptions({ queryKey: queryKeys.notifications(orgId), queryFn: () => getNotifications(orgId), refetchInterval: 60_000 });
}

export function useNotifications(orgId: string) {
  return useQuery(getNotificationsQueryOptions(orgId));
}
