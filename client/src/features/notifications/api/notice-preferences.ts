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

/**
 * Switches kinds' e-mail on or off. The box follows the click at once (a checkbox that lags behind
 * its click reads as broken); if the server refuses, the list goes back to what was saved.
 */
export function useUpdateNoticePreferences(orgId: string) {
  const queryClient = useQueryClient();
  const key = queryKeys.noticePreferences(orgId);
  return useMutation({
    mutationFn: (input: NoticePreferencesUpdateInput) => updateNoticePreferences(orgId, input),
    onMutate: async (input) => {
      await queryClient.cancelQueries({ queryKey: key });
      const before = queryClient.getQueryData<NoticePreferenceDto[]>(key);
      const asked = input.email as Record<string, boolean | undefined>;
      queryClient.setQueryData<NoticePreferenceDto[]>(key, (old) =>
        old?.map((p) => (p.fixed || asked[p.kind] === undefined ? p : { ...p, email: asked[p.kind]! })),
      );
      return { before };
    },
    onError: (_error, _input, context) => queryClient.setQueryData(key, context?.before),
    onSuccess: (saved) => queryClient.setQueryData(key, saved),
  });
}
