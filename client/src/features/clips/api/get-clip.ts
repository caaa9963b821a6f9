import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ClipDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';
import { apiHref } from '../../../lib/upload';

/** One clip with its notes, ordered by where they are pinned. */
export function getClip(orgId: string, clipId: string): Promise<ClipDto> {
  return api.get<ClipDto>(`/orgs/${orgId}/clips/${clipId}`);
}

export function getClipQueryOptions(orgId: string, clipId: string) {
  return queryOptions({ queryKey: queryKeys.clip(orgId, clipId), queryFn: () => getClip(orgId, clipId) });
}

export function useClip(orgId: string, clipId: string) {
  return useQuery(getClipQueryOptions(orgId, clipId));
}

/** The video's address; the server answers range requests, so the browser can seek without the whole file. */
export function clipVideoHref(orgId: string, clip: Pick<ClipDto, 'id' | 'videoPath'>): string {
  return clip.videoPath ? apiHref(clip.videoPath) : `/api/orgs/${orgId}/clips/${clip.id}/video`;
}
