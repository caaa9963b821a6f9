import { useMutation } from '@tanstack/react-query';
import type { PasswordResetConfirmInput, PasswordResetRequestInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';

/** The server answers the same whether or not the address has an account. */
export function requestPasswordReset(input: PasswordResetRequestInput): Promise<{ message: string }> {
  return api.post<{ message: string }>('/password-reset', input);
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}

export function confirmPasswordReset(input: PasswordResetConfirmInput): Promise<void> {
  return api.post<void>('/password-reset/confirm', input);
}

export function useConfirmPasswordReset() {
  return useMutation({ mutationFn: confirmPasswordReset });
}
