import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import type { SignInSchema } from '../../../../../policies/schemas/auth';
import type { SessionDto } from '../../../../../policies/dto';
import { isApiError } from '../../../lib/api-client';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { lazyZodResolver } from '../../../lib/lazy-resolver';
import { Button } from '../../../components/ui/Button';
import { Notice } from '../../../components/ui/Notice';
import { useSignIn } from '../api/sign-in';
import { AccountFailureNotice, EmailField, PasswordField } from './account-form-parts';

type SignInFormInput = z.input<typeof SignInSchema>;
type SignInFormOutput = z.output<typeof SignInSchema>;

/** Whatever the server's reason, a failed password check reads the same: it never says which part was wrong. */
export const WRONG_CREDENTIALS = 'E-mail or password is incorrect.';

/** The shared schema's check, fetched when the form is first focused rather than with the page. */
const signInCheck = lazyZodResolver(() => import('../../../../../policies/schemas/auth').then((m) => m.SignInSchema));

export function SignInForm({ onSignedIn }: { onSignedIn: (session: SessionDto) => void }) {
  const signIn = useSignIn();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<SignInFormInput, unknown, SignInFormOutput>({
    resolver: signInCheck.resolver,
    defaultValues: { email: '', password: '' },
  });

  const onSubmit = handleSubmit((values) =>
    signIn.mutate(values, {
      onSuccess: (session) => onSignedIn(session),
      onError: (error) => applyServerFieldErrors(error, setError, ['email', 'password']),
    }),
  );

  const failure = signIn.error;
  return (
    <form onSubmit={onSubmit} onFocus={signInCheck.preload} noValidate className="space-y-4" aria-label="Sign in">
      {failure &&
        (isApiError(failure) && failure.code === 'invalid_credentials' ? (
          <Notice tone="problem" role="alert">
            <p>{WRONG_CREDENTIALS}</p>
          </Notice>
        ) : (
          <AccountFailureNotice error={failure} limitedTitle="Too many attempts" />
        ))}
      <EmailField error={errors.email?.message} {...register('email')} />
      <PasswordField label="Password" autoComplete="current-password" error={errors.password?.message} {...register('password')} />
      <Button type="submit" size="lg" busy={signIn.isPending}>
        {signIn.isPending ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  );
}
