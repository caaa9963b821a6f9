import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PersonDto } from '../../../../../policies/dto';
import type { MembershipUpdateInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';
import { sessionQueryKey } from '../../../lib/query-client';

export function updatePersonRoles(orgId: string, personId: string, input: MembershipUpdateInput): Promise<PersonDto> {
  return api.patch<PersonDto>(`/orgs/${orgId}/people/${personId}`, input);
}

export function useUpdatePersonRoles(orgId: string, personId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: MembershipUpdateInput) => updatePersonRoles(orgId, personId, input),
    onSuccess: (person) => {
      queryClient.setQueryData(queryKeys.person(orgId, personId), person);
      void queryClient.invalidateQueries({ queryKey: queryKeys.people(orgId) });
      void queryClient.invalidateQueries({ queryKey: queryKeys.athletes(orgId) });
      // An admin may have changed their own roles; the session carries them.
      void queryClient.invalidateQueries({ queryKey: sessionQueryKey });
    },
  });
}
