import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ExerciseDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { programKeys } from './keys';

/** The organization's exercise library, archived ones included (old sessions still name them). */
export function getLibrary(orgId: string): Promise<ExerciseDto[]> {
  return api.get<ExerciseDto[]>(`/orgs/${orgId}/exercises`);
}

export function getLibraryQueryOptions(orgId: string) {
  return queryOptions({ queryKey: programKeys.exercises(orgId), queryFn: () => getLibrary(orgId), staleTime: 60_000 });
}

export function useLibrary(orgId: string, enabled = true) {
  return useQuery({ ...getLibraryQueryOptions(orgId), enabled });
}
