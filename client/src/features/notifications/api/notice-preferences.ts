import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { NoticePreferenceDto } from '../../../../../policies/dto';
import type { NoticePreferencesUpdateInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

/** Which of my notices also come by e-mail, one row per kind my roles receive. */
export function getNoticePreferences(orgId: string): Promise<NoticePreferenceDto[]> {
  return api.get<NoticePreferenceDto[]>(`/orgs/${orgId}/notice-preferences`);
}

export function getNoticePreferencesQueryOptions(orgId: string) {
  return queryOptions({ queryKey: queryKeys.noticePreferences(orgId), queryFn: () => getNoticePreferences(orgId) });
}

export function useNoticePreferences(orgId: string) {
  return useQuery(getNoticePreferencesQueryOptions(orgId));
}

export function updateNoticePreferences(orgId: string, input: NoticePreferencesUpdateInput): Promise<NoticePreferenceDto[]> {
  return api.patch<NoticePreferenceDto[]>(`/orgs/${orgId}/notice-preferences`, input);
}

/** Switches one kind's e-mail on or off; the answer is the whole list as saved. */
export function useUpdateNoticePreferences(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: NoticePreferencesUpdateInput) => updateNoticePreferences(orgId, input),
    onSuccess: (saved) => queryClient.setQueryData(queryKeys.noticePreferences(orgId), saved),
  });
}
