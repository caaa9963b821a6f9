import { queryOptions, useQuery } from '@tanstack/react-query';
import type { InvitationPreviewDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';

export const PREVIEW_KEY = 'invitation-preview';

/** A POST, so the token travels in the body and never in a URL the server might log. */
export function previewInvitation(token: string): Promise<InvitationPreviewDto> {
  return api.post<InvitationPreviewDto>('/invitations/preview', { token });
}

export function previewInvitationQueryOptions(token: string) {
  return queryOptions({
    queryKey: [PREVIEW_KEY, token] as const,
    queryFn: () => previewInvitation(token),
    staleTime: Infinity,
    retry: false,
  });
}

export function useInvitationPreview(token: string | null) {
  return useQuery({ ...previewInvitationQueryOptions(token ?? ''), enabled: token !== null });
}
