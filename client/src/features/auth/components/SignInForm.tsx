import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { SignInSchema } from '../../../../../policies/schemas';
import type { SessionDto } from '../../../../../policies/dto';
import { isApiError } from '../../../lib/api-client';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { useSignIn } from '../api/sign-in';

type SignInFormInput = z.input<typeof SignInSchema>;
type SignInFormOutput = z.output<typeof SignInSchema>;

/** Whatever the server's reason, a failed password check reads the same: it never says which part was wrong. */
export const WRONG_CREDENTIALS = 'E-mail or password is incorrect.';

export function SignInForm({ onSignedIn }: { onSignedIn: (session: SessionDto) => void }) {
  const signIn = useSignIn();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<SignInFormInput, unknown, SignInFormOutput>({
    resolver: zodResolver(SignInSchema),
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
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label="Sign in">
      {failure &&
        (isApiError(failure) && failure.code === 'invalid_credentials' ? (
          <Notice tone="problem" role="alert">
            <p>{WRONG_CREDENTIALS}</p>
          </Notice>
        ) : isApiError(failure) && failure.code === 'rate_limited' ? (
          <Notice tone="problem" role="alert" title="Too many attempts">
            <p>{failure.message}</p>
          </Notice>
        ) : (
          <ErrorNotice error={failure} />
        ))}
      <TextField
        label="E-mail"
        type="email"
        autoComplete="username"
        inputMode="email"
        large
        error={errors.email?.message}
        {...register('email')}
      />
      <TextField
        label="Password"
        type="password"
        autoComplete="current-password"
        large
        error={errors.password?.message}
        {...register('password')}
      />
      <Button type="submit" size="lg" busy={signIn.isPending}>
        {signIn.isPending ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  );
}
