import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { InvitationAcceptSchema, InvitationTokenSchema } from '../../../../../policies/schemas';
import { ROLE_LABELS } from '../../../../../policies/roles';
import type { InvitationPreviewDto, SessionDto } from '../../../../../policies/dto';
import { isApiError } from '../../../lib/api-client';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { formatDateTime, joinNames } from '../../../lib/format';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Facts, Loading } from '../../../components/ui/Panel';
import { useInvitationPreview } from '../api/preview-invitation';
import { useAcceptInvitation } from '../api/accept-invitation';

type Input = z.input<typeof InvitationAcceptSchema>;
type Output = z.output<typeof InvitationAcceptSchema>;

const emptyToUndefined = (v: unknown) => (v === '' ? undefined : v);

/** Reads the token from an invite link's fragment ('#<token>'), which never reaches the server's logs. */
export function tokenFromHash(hash: string): string | null {
  const raw = hash.startsWith('#') ? hash.slice(1) : hash;
  const parsed = InvitationTokenSchema.safeParse({ token: decodeURIComponent(raw).trim() });
  return parsed.success ? parsed.data.token : null;
}

export function AcceptInvitation({ hash, onAccepted }: { hash: string; onAccepted: (session: SessionDto) => void }) {
  const token = tokenFromHash(hash);
  const preview = useInvitationPreview(token);

  if (token === null) {
    return (
      <Notice tone="problem" role="alert" title="This invitation link is incomplete">
        <p>
          Open the whole link from your invitation. If it still does not work, ask your organization&apos;s administrator for a new
          invitation.
        </p>
      </Notice>
    );
  }
  if (preview.isPending) return <Loading what="your invitation" />;
  if (preview.isError) {
    const gone = isApiError(preview.error) && preview.error.code === 'invitation_invalid';
    return gone ? (
      <Notice tone="problem" role="alert" title="This invitation can't be used">
        <p>{preview.error.message}</p>
        <p>Ask your organization&apos;s administrator to send you a new one.</p>
      </Notice>
    ) : (
      <ErrorNotice error={preview.error} />
    );
  }
  return <AcceptForm token={token} preview={preview.data} onAccepted={onAccepted} />;
}

function AcceptForm({
  token,
  preview,
  onAccepted,
}: {
  token: string;
  preview: InvitationPreviewDto;
  onAccepted: (session: SessionDto) => void;
}) {
  const accept = useAcceptInvitation();
  const isAthlete = preview.roles.includes('athlete');
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<Input, unknown, Output>({
    resolver: zodResolver(InvitationAcceptSchema),
    defaultValues: { token, displayName: preview.displayName ?? '', password: '' },
  });

  const onSubmit = handleSubmit((values) =>
    accept.mutate(values, {
      onSuccess: (session) => onAccepted(session),
      onError: (error) => applyServerFieldErrors(error, setError, ['displayName', 'password', 'dateOfBirth']),
    }),
  );

  return (
    <div className="space-y-5">
      <div className="rounded-lg border border-rule bg-sheet p-4">
        <p className="text-base">
          You have been invited to join <strong>{preview.organizationName}</strong> as{' '}
          {joinNames(preview.roles.map((r) => ROLE_LABELS[r].toLowerCase()))}.
        </p>
        <div className="mt-3">
          <Facts
            items={[
              { label: 'E-mail', value: preview.email },
              { label: 'Link expires', value: formatDateTime(preview.expiresAt) },
            ]}
          />
        </div>
      </div>

      <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label="Accept invitation">
        <ErrorNotice error={accept.error} />
        {preview.hasAccount && (
          <Notice tone="info">
            <p>
              You already have a Loadline account for {preview.email}. Enter that account&apos;s password to add {preview.organizationName}{' '}
              to it.
            </p>
          </Notice>
        )}
        {/* Lets a password manager pair the new password with the right e-mail address. */}
        <input type="email" name="username" autoComplete="username" value={preview.email} readOnly hidden />
        <input type="hidden" {...register('token')} />
        <TextField
          label="Your name"
          hint="As your care team should see it."
          autoComplete="name"
          large
          error={errors.displayName?.message}
          {...register('displayName')}
        />
        <TextField
          label="Password"
          type="password"
          hint={
            preview.hasAccount
              ? 'The password you already use for Loadline.'
              : 'At least 8 characters; a longer phrase of 15 or more is better.'
          }
          autoComplete={preview.hasAccount ? 'current-password' : 'new-password'}
          large
          error={errors.password?.message}
          {...register('password')}
        />
        {isAthlete && (
          <TextField
            label="Date of birth (optional)"
            type="date"
            hint="Used to tell whether a guardian must be involved. Leave it empty if your organization already has it."
            large
            error={errors.dateOfBirth?.message}
            {...register('dateOfBirth', { setValueAs: emptyToUndefined })}
          />
        )}
        <Button type="submit" size="lg" busy={accept.isPending}>
          Accept invitation
        </Button>
      </form>
    </div>
  );
}
