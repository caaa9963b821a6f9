import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { Link } from 'react-router-dom';
import { PasswordResetConfirmSchema } from '../../../../../policies/schemas';
import { isApiError } from '../../../lib/api-client';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { Button } from '../../../components/ui/Button';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { useConfirmPasswordReset } from '../api/password-reset';
import { PasswordField } from './account-form-parts';

type Input = z.input<typeof PasswordResetConfirmSchema>;
type Output = z.output<typeof PasswordResetConfirmSchema>;

/** Reads the token from a reset link's fragment ('#<token>'), which never reaches the server's logs. */
export function resetTokenFromHash(hash: string): string | null {
  const raw = hash.startsWith('#') ? hash.slice(1) : hash;
  const parsed = PasswordResetConfirmSchema.shape.token.safeParse(decodeURIComponent(raw).trim());
  return parsed.success ? parsed.data : null;
}

export function ResetPasswordForm({ hash, onDone }: { hash: string; onDone: () => void }) {
  const token = resetTokenFromHash(hash);
  const confirm = useConfirmPasswordReset();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<Input, unknown, Output>({
    resolver: zodResolver(PasswordResetConfirmSchema),
    defaultValues: { token: token ?? '', password: '' },
  });

  if (token === null) {
    return (
      <Notice tone="problem" role="alert" title="This link is incomplete">
        <p>Open the whole link from the e-mail, or ask for a new one.</p>
        <p>
          <Link to="/forgot-password">Ask for a new link</Link>
        </p>
      </Notice>
    );
  }

  const onSubmit = handleSubmit((values) =>
    confirm.mutate(values, {
      onSuccess: onDone,
      onError: (error) => applyServerFieldErrors(error, setError, ['password']),
    }),
  );
  const failure = confirm.error;
  const unusable = isApiError(failure) && failure.code === 'reset_invalid';

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label="Choose a new password">
      {unusable ? (
        <Notice tone="problem" role="alert" title="This link can't be used">
          <p>{failure.message}</p>
          <p>
            <Link to="/forgot-password">Ask for a new link</Link>
          </p>
        </Notice>
      ) : (
        <ErrorNotice error={failure} />
      )}
      <input type="hidden" {...register('token')} />
      <PasswordField
        label="New password"
        hint="At least 8 characters; a longer phrase of 15 or more is better. Other devices signed in to your account are signed out."
        autoComplete="new-password"
        error={errors.password?.message}
        {...register('password')}
      />
      <Button type="submit" size="lg" busy={confirm.isPending}>
        Save the new password
      </Button>
    </form>
  );
}
