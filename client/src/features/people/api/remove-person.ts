import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';
import { sessionQueryKey } from '../../../lib/query-client';

export function removePerson(orgId: string, personId: string): Promise<void> {
  return api.delete(`/orgs/${orgId}/people/${personId}`);
}

export function useRemovePerson(orgId: string, personId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => removePerson(orgId, personId),
    onSuccess: () => {
      queryClient.removeQueries({ queryKey: queryKeys.person(orgId, personId) });
      void queryClient.invalidateQueries({ queryKey: queryKeys.org(orgId) });
      void queryClient.invalidateQueries({ queryKey: sessionQueryKey });
    },
  });
}
