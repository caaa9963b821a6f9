import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { NotificationDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export function markNotificationRead(orgId: string, id: string): Promise<void> {
  return api.post<void>(`/orgs/${orgId}/notifications/${id}/read`);
}

export function markAllNotificationsRead(orgId: string): Promise<void> {
  return api.post<void>(`/orgs/${orgId}/notifications/read-all`);
}

/** Marks one notice (or, with no id, all of them) read; the list and the header count follow. */
export function useMarkRead(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: string | null) => (id ? markNotificationRead(orgId, id) : markAllNotificationsRead(orgId)),
    onSuccess: (_void, id) => {
      const now = new Date().toISOString();
      queryClient.setQueryData<NotificationDto[]>(queryKeys.notifications(orgId), (old) =>
        old?.map((n) => (n.readAt || (id && n.id !== id) ? n : { ...n, readAt: now })),
      );
      void queryClient.invalidateQueries({ queryKey: queryKeys.notifications(orgId) });
    },
  });
}
