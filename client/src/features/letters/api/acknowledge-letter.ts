import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LetterDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

/** A guardian's "I have read this letter", time-stamped by the server; a second press changes nothing. */
export function acknowledgeLetter(orgId: string, letterId: string): Promise<LetterDto> {
  return api.post<LetterDto>(`/orgs/${orgId}/letters/${letterId}/acknowledge`);
}

export function useAcknowledgeLetter(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (letterId: string) => acknowledgeLetter(orgId, letterId),
    onSuccess: (saved) => {
      // Show the acknowledgement at once in every list that holds this letter, then confirm with the server.
      queryClient.setQueriesData<LetterDto[]>({ queryKey: queryKeys.lettersAll(orgId) }, (old) =>
        old?.map((l) => (l.id === saved.id ? saved : l)),
      );
      void queryClient.invalidateQueries({ queryKey: queryKeys.lettersAll(orgId) });
    },
  });
}
