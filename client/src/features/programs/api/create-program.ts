import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ProgramDto } from '../../../../../policies/dto';
import type { ProgramCreateInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { refreshAfterProgramChange } from './get-programs';
import { programKeys } from './keys';

export function createProgram(orgId: string, input: ProgramCreateInput): Promise<ProgramDto> {
  return api.post<ProgramDto>(`/orgs/${orgId}/programs`, input);
}

export function useCreateProgram(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ProgramCreateInput) => createProgram(orgId, input),
    onSuccess: (program) => {
      queryClient.setQueryData(programKeys.program(orgId, program.id), program);
      refreshAfterProgramChange(queryClient, orgId);
    },
  });
}
