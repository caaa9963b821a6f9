import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import type { SecondStepSchema } from '../../../../../policies/schemas/account-security';
import type { SessionDto } from '../../../../../policies/dto';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { lazyZodResolver } from '../../../lib/lazy-resolver';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { useSecondStep } from '../api/second-step';
import { AccountFailureNotice } from './account-form-parts';

type Input = z.input<typeof SecondStepSchema>;
type Output = z.output<typeof SecondStepSchema>;

/** Shown on the sign-in page: the shared schema's check comes when the code is first checked. */
const codeCheck = lazyZodResolver(() => import('../../../../../policies/schemas/account-security').then((m) => m.SecondStepSchema));

/** The second sign-in screen: the password was right, now a code from the app (or a recovery code). */
export function SecondStepForm({ onSignedIn, onStartOver }: { onSignedIn: (session: SessionDto) => void; onStartOver: () => void }) {
  const step = useSecondStep();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<Input, unknown, Output>({ resolver: codeCheck.resolver, defaultValues: { code: '' } });

  const onSubmit = handleSubmit((values) =>
    step.mutate(values, {
      onSuccess: (session) => onSignedIn(session),
      onError: (error) => applyServerFieldErrors(error, setError, ['code']),
    }),
  );

  const failure = step.error;
  return (
    <form onSubmit={onSubmit} onFocus={codeCheck.preload} noValidate className="space-y-4" aria-label="Enter your sign-in code">
      <p className="text-sm text-ink-2">
        Your password is right. Open the authenticator app you linked to Loadline and enter the 6-digit code it shows for Loadline now.
        Without your phone, enter one of the recovery codes you saved instead.
      </p>
      <AccountFailureNotice error={failure} limitedTitle="Too many attempts" />
      <TextField
        label="Sign-in code"
        hint="6 digits from the app, or a recovery code like abcde-12345."
        autoComplete="one-time-code"
        inputMode="text"
        autoFocus
        large
        error={errors.code?.message}
        {...register('code')}
      />
      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" size="lg" busy={step.isPending}>
          {step.isPending ? 'Checking…' : 'Finish signing in'}
        </Button>
        <Button variant="secondary" onClick={onStartOver}>
          Start again
        </Button>
      </div>
    </form>
  );
}
