import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LetterDto } from '../../../../../policies/dto';
import type { z } from 'zod';
import type { LetterSignSchema } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export type LetterSignInput = z.output<typeof LetterSignSchema>;

/** Freezes the draft, supersedes the athlete's earlier letter and queues the e-mails. The answer carries the code, once. */
export function signLetter(orgId: string, letterId: string, input: LetterSignInput): Promise<LetterDto> {
  return api.post<LetterDto>(`/orgs/${orgId}/letters/${letterId}/sign`, input);
}

export function useSignLetter(orgId: string, letterId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: LetterSignInput) => signLetter(orgId, letterId, input),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: queryKeys.lettersAll(orgId) });
      void queryClient.invalidateQueries({ queryKey: queryKeys.audit(orgId) });
    },
  });
}
