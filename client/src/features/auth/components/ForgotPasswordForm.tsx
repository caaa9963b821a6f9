import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { PasswordResetRequestSchema } from '../../../../../policies/schemas';
import { Button } from '../../../components/ui/Button';
import { Notice } from '../../../components/ui/Notice';
import { useRequestPasswordReset } from '../api/password-reset';
import { AccountFailureNotice, EmailField } from './account-form-parts';

type Input = z.input<typeof PasswordResetRequestSchema>;
type Output = z.output<typeof PasswordResetRequestSchema>;

/** Asks for a reset link. The answer reads the same whether or not the address has an account. */
export function ForgotPasswordForm() {
  const request = useRequestPasswordReset();
  const {
    register,
    handleSubmit,
    getValues,
    formState: { errors },
  } = useForm<Input, unknown, Output>({ resolver: zodResolver(PasswordResetRequestSchema), defaultValues: { email: '' } });

  if (request.isSuccess) {
    return (
      <Notice tone="done" role="status" title="Check your e-mail">
        <p>{request.data.message}</p>
        <p>
          The link works once and only for a short while. If nothing arrives within a few minutes, check the address you entered (
          {getValues('email')}) and ask again.
        </p>
      </Notice>
    );
  }

  return (
    <form onSubmit={handleSubmit((values) => request.mutate(values))} noValidate className="space-y-4" aria-label="Ask for a password link">
      <AccountFailureNotice error={request.error} limitedTitle="Too many requests" />
      <EmailField hint="The address you sign in with." error={errors.email?.message} {...register('email')} />
      <Button type="submit" size="lg" busy={request.isPending}>
        Send me a link
      </Button>
    </form>
  );
}
