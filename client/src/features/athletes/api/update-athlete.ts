import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AthleteProfileDto } from '../../../../../policies/dto';
import type { AthleteProfileUpdateInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export function updateAthlete(orgId: string, athleteId: string, input: AthleteProfileUpdateInput): Promise<AthleteProfileDto> {
  return api.patch<AthleteProfileDto>(`/orgs/${orgId}/athletes/${athleteId}`, input);
}

export function useUpdateAthlete(orgId: string, athleteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: AthleteProfileUpdateInput) => updateAthlete(orgId, athleteId, input),
    onSuccess: (athlete) => {
      queryClient.setQueryData(queryKeys.athlete(orgId, athleteId), athlete);
      void queryClient.invalidateQueries({ queryKey: queryKeys.athletes(orgId) });
      void queryClient.invalidateQueries({ queryKey: queryKeys.people(orgId) });
    },
  });
}
