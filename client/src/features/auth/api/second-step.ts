import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SessionDto } from '../../../../../policies/dto';
import type { SecondStepInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { sessionQueryKey } from '../../../lib/query-client';
import { rememberSession } from './get-session';

/** Finishes signing in with a code from the authenticator app or a recovery code. */
export async function completeSecondStep(input: SecondStepInput): Promise<SessionDto> {
  return rememberSession(await api.post<SessionDto>('/session/second-step', input));
}

export function useSecondStep() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: completeSecondStep,
    onSuccess: (session) => {
      queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== sessionQueryKey[0] });
      queryClient.setQueryData(sessionQueryKey, session);
    },
  });
}
