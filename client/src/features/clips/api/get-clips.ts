import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ClipDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export interface ClipFilters {
  athleteId?: string;
  trainingLogId?: string;
}

/**
 * Clips the reader may watch, newest first, without their notes. A guardian gets an empty list while
 * the organization keeps clips from guardians, so an empty answer is not a refusal.
 */
export function getClips(orgId: string, filters: ClipFilters): Promise<ClipDto[]> {
  return api.get<ClipDto[]>(`/orgs/${orgId}/clips`, { query: { athleteId: filters.athleteId, trainingLogId: filters.trainingLogId } });
}

export function getClipsQueryOptions(orgId: string, filters: ClipFilters) {
  return queryOptions({ queryKey: queryKeys.clips(orgId, filters), queryFn: () => getClips(orgId, filters) });
}

export function useClips(orgId: string, filters: ClipFilters) {
  return useQuery(getClipsQueryOptions(orgId, filters));
}
