import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { BaselineDto } from '../../../../../policies/dto';
import type { BaselineCreateInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { refreshAfterProgramChange } from './get-programs';
import { programKeys } from './keys';

/** An athlete's strength history, newest first: tested maxes, estimates and logged sets. */
export function getBaselines(orgId: string, athleteId: string): Promise<BaselineDto[]> {
  return api.get<BaselineDto[]>(`/orgs/${orgId}/athletes/${athleteId}/baselines`);
}

export function getBaselinesQueryOptions(orgId: string, athleteId: string) {
  return queryOptions({ queryKey: programKeys.baselines(orgId, athleteId), queryFn: () => getBaselines(orgId, athleteId) });
}

export function useBaselines(orgId: string, athleteId: string) {
  return useQuery(getBaselinesQueryOptions(orgId, athleteId));
}

/**
 * The engine's 1RM per lift, as the server picks it: the latest tested or estimated baseline
 * (logged sets are history only). The list arrives newest first.
 */
export function currentOneRms(baselines: BaselineDto[]): Record<string, BaselineDto> {
  const out: Record<string, BaselineDto> = {};
  for (const b of baselines) if (b.kind !== 'logged' && !out[b.exerciseId]) out[b.exerciseId] = b;
  return out;
}

export function recordBaseline(orgId: string, athleteId: string, input: BaselineCreateInput): Promise<BaselineDto> {
  return api.post<BaselineDto>(`/orgs/${orgId}/athletes/${athleteId}/baselines`, input);
}

export function useRecordBaseline(orgId: string, athleteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: BaselineCreateInput) => recordBaseline(orgId, athleteId, input),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: programKeys.baselines(orgId, athleteId) });
      // A new max moves every %-of-1RM cap: the server re-checks published sessions and may hold some.
      refreshAfterProgramChange(queryClient, orgId);
    },
  });
}
