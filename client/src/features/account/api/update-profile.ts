import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SessionDto, UserDto } from '../../../../../policies/dto';
import type { ProfileUpdateInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { sessionQueryKey } from '../../../lib/query-client';

export function updateProfile(input: ProfileUpdateInput): Promise<UserDto> {
  return api.patch<UserDto>('/me', input);
}

export function useUpdateProfile() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateProfile,
    onSuccess: (user) => {
      queryClient.setQueryData<SessionDto>(sessionQueryKey, (session) => (session ? { ...session, user } : session));
    },
  });
}
