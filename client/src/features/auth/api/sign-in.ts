import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SessionDto } from '../../../../../policies/dto';
import type { SignInInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { sessionQueryKey } from '../../../lib/query-client';
import { rememberSession } from './get-session';

export async function signIn(input: SignInInput): Promise<SessionDto> {
  return rememberSession(await api.post<SessionDto>('/session', input));
}

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: (session) => {
      // Nothing cached for a previous person may show for this one.
      queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== sessionQueryKey[0] });
      queryClient.setQueryData(sessionQueryKey, session);
    },
  });
}
