import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { TwoStepDisableSchema, TwoStepEnableSchema } from '../../../../../policies/schemas';
import type { TwoStepSetupDto } from '../../../../../policies/dto';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { formatDateTime } from '../../../lib/format';
import { Button } from '../../../components/ui/Button';
import { CopyField } from '../../../components/ui/CopyField';
import { TextField } from '../../../components/ui/Field';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Loading, Panel } from '../../../components/ui/Panel';
import { useDisableTwoStep, useEnableTwoStep, useRenewRecoveryCodes, useStartTwoStepSetup, useTwoStepStatus } from '../api/two-step';

/**
 * "Two-step sign-in" on the account page: after the password, a 6-digit code from an authenticator
 * app on the person's phone. Set up with a QR code (or the key typed in), confirmed with a code,
 * then recovery codes shown once.
 */
export function TwoStepSection() {
  const status = useTwoStepStatus();
  const [setup, setSetup] = useState<TwoStepSetupDto | null>(null);
  const [recoveryCodes, setRecoveryCodes] = useState<string[] | null>(null);

  let body;
  if (status.isPending) body = <Loading what="two-step sign-in" />;
  else if (status.isError) body = <ErrorNotice error={status.error} />;
  else if (recoveryCodes) body = <RecoveryCodes codes={recoveryCodes} onDone={() => setRecoveryCodes(null)} />;
  else if (status.data.enabled) {
    body = (
      <div className="space-y-4">
        <p className="text-sm">
          <strong>On</strong> since {formatDateTime(status.data.enabledAt!)}. Signing in asks for a code from your app after your password.
          Recovery codes left: <span className="tabular-nums">{status.data.recoveryCodesLeft}</span>.
        </p>
        {status.data.recoveryCodesLeft <= 2 && (
          <Notice tone="caution">
            <p>Few recovery codes are left. Get a new set below; the old ones then stop working.</p>
          </Notice>
        )}
        <div className="flex flex-wrap items-start gap-3">
          <RenewCodesForm onRenewed={setRecoveryCodes} />
          <DisableForm />
        </div>
      </div>
    );
  } else if (setup) {
    body = (
      <SetupSteps
        setup={setup}
        onEnabled={(codes) => {
          setSetup(null);
          setRecoveryCodes(codes);
        }}
        onCancel={() => setSetup(null)}
      />
    );
  } else body = <StartSetup onStarted={setSetup} />;

  return (
    <Panel title="Two-step sign-in">
      <p className="mb-4 text-sm text-ink-2">
        Your account opens health records, so a password alone is a thin lock. With two-step sign-in, Loadline also asks for a short code
        that an authenticator app on your phone makes every 30 seconds.
      </p>
      {body}
    </Panel>
  );
}

function StartSetup({ onStarted }: { onStarted: (setup: TwoStepSetupDto) => void }) {
  const start = useStartTwoStepSetup();
  return (
    <div className="space-y-3">
      <p className="text-sm">
        <strong>Off.</strong> You need an authenticator app on your phone (any app that reads time-based codes works).
      </p>
      <ErrorNotice error={start.error} />
      <Button busy={start.isPending} onClick={() => start.mutate(undefined, { onSuccess: onStarted })}>
        Set up two-step sign-in
      </Button>
    </div>
  );
}

type EnableInput = z.input<typeof TwoStepEnableSchema>;
type EnableOutput = z.output<typeof TwoStepEnableSchema>;

function SetupSteps({
  setup,
  onEnabled,
  onCancel,
}: {
  setup: TwoStepSetupDto;
  onEnabled: (codes: string[]) => void;
  onCancel: () => void;
}) {
  const enable = useEnableTwoStep();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<EnableInput, unknown, EnableOutput>({ resolver: zodResolver(TwoStepEnableSchema), defaultValues: { code: '' } });
  const onSubmit = handleSubmit((values) =>
    enable.mutate(values, {
      onSuccess: (dto) => onEnabled(dto.recoveryCodes),
      onError: (error) => applyServerFieldErrors(error, setError, ['code']),
    }),
  );
  return (
    <div className="space-y-4">
      <ol className="list-decimal space-y-2 pl-5 text-sm">
        <li>In your authenticator app, add an account and scan this code.</li>
        <li>If you can&apos;t scan it, type the key below into the app instead (time-based, 6 digits).</li>
        <li>Enter the code the app now shows for Loadline to switch two-step sign-in on.</li>
      </ol>
      <img
        src={setup.qrDataUrl}
        width={200}
        height={200}
        alt="QR code to add Loadline to your authenticator app"
        className="rounded-md border border-rule"
      />
      <CopyField label="Key for typing in by hand" value={setup.secret} buttonLabel="Copy key" />
      <form onSubmit={onSubmit} noValidate className="max-w-sm space-y-3" aria-label="Confirm two-step sign-in">
        {!errors.code && <ErrorNotice error={enable.error} />}
        <TextField
          label="Code from your app"
          autoComplete="one-time-code"
          inputMode="numeric"
          error={errors.code?.message}
          {...register('code')}
        />
        <div className="flex flex-wrap gap-3">
          <Button type="submit" busy={enable.isPending}>
            Switch on
          </Button>
          <Button variant="secondary" onClick={onCancel}>
            Not now
          </Button>
        </div>
      </form>
    </div>
  );
}

function RecoveryCodes({ codes, onDone }: { codes: string[]; onDone: () => void }) {
  return (
    <div className="space-y-3">
      <Notice tone="done" role="status" title="Save your recovery codes">
        <p>
          Keep these recovery codes somewhere safe, away from your phone. Each one lets you sign in once if your phone is lost. This is the
          only time they are shown.
        </p>
      </Notice>
      <ul aria-label="Recovery codes" className="grid max-w-sm grid-cols-2 gap-2 font-mono text-sm tabular-nums">
        {codes.map((c) => (
          <li key={c} className="rounded border border-rule bg-paper px-2 py-1">
            {c}
          </li>
        ))}
      </ul>
      <CopyField label="All codes, to paste into a password manager" value={codes.join(' ')} buttonLabel="Copy codes" />
      <Button onClick={onDone}>I have saved them</Button>
    </div>
  );
}

type ConfirmInput = z.input<typeof TwoStepDisableSchema>;
type ConfirmOutput = z.output<typeof TwoStepDisableSchema>;

function DisableForm() {
  const disable = useDisableTwoStep();
  return (
    <ConfirmItIsYou
      opener="Turn two-step sign-in off…"
      label="Turn two-step sign-in off"
      intro="To turn it off, confirm it is you: your password and a code from your app (or a recovery code)."
      submit="Turn off"
      cancel="Keep it on"
      mutation={disable}
      onConfirmed={() => undefined}
    />
  );
}

function RenewCodesForm({ onRenewed }: { onRenewed: (codes: string[]) => void }) {
  const renew = useRenewRecoveryCodes();
  return (
    <ConfirmItIsYou
      opener="Get new recovery codes…"
      label="Get new recovery codes"
      intro="Confirm it is you: your password and a code from your app. Your old recovery codes then stop working."
      submit="Get new codes"
      cancel="Not now"
      mutation={renew}
      onConfirmed={(dto) => onRenewed(dto.recoveryCodes)}
    />
  );
}

/** A change to two-step sign-in itself: behind a button, then the password and a code again. */
function ConfirmItIsYou<T>({
  opener,
  label,
  intro,
  submit,
  cancel,
  mutation,
  onConfirmed,
}: {
  opener: string;
  label: string;
  intro: string;
  submit: string;
  cancel: string;
  mutation: {
    mutate: (v: ConfirmOutput, o: { onSuccess: (r: T) => void; onError: (e: unknown) => void }) => void;
    isPending: boolean;
    error: unknown;
  };
  onConfirmed: (result: T) => void;
}) {
  const [open, setOpen] = useState(false);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<ConfirmInput, unknown, ConfirmOutput>({
    resolver: zodResolver(TwoStepDisableSchema),
    defaultValues: { password: '', code: '' },
  });
  if (!open) {
    return (
      <Button variant="secondary" onClick={() => setOpen(true)}>
        {opener}
      </Button>
    );
  }
  const onSubmit = handleSubmit((values) =>
    mutation.mutate(values, {
      onSuccess: (result) => {
        setOpen(false);
        onConfirmed(result);
      },
      onError: (error) => applyServerFieldErrors(error, setError, ['password', 'code']),
    }),
  );
  return (
    <form onSubmit={onSubmit} noValidate className="w-full max-w-sm space-y-3" aria-label={label}>
      <p className="text-sm text-ink-2">{intro}</p>
      {!errors.password && !errors.code && <ErrorNotice error={mutation.error} />}
      <TextField
        label="Password"
        type="password"
        autoComplete="current-password"
        error={errors.password?.message}
        {...register('password')}
      />
      <TextField label="Code from your app" autoComplete="one-time-code" error={errors.code?.message} {...register('code')} />
      <div className="flex flex-wrap gap-3">
        <Button type="submit" busy={mutation.isPending}>
          {submit}
        </Button>
        <Button variant="secondary" onClick={() => setOpen(false)}>
          {cancel}
        </Button>
      </div>
    </form>
  );
}
