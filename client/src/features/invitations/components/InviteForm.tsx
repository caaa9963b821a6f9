import { useState } from 'react';
import { Controller, useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { InvitationCreateSchema } from '../../../../../policies/schemas';
import { ROLES, ROLE_LABELS } from '../../../../../policies/roles';
import type { InvitationDto } from '../../../../../policies/dto';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { formatDateTime } from '../../../lib/format';
import { Button } from '../../../components/ui/Button';
import { CheckboxGroup, TextField } from '../../../components/ui/Field';
import { CopyField } from '../../../components/ui/CopyField';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { useCreateInvitation } from '../api/create-invitation';

type Input = z.input<typeof InvitationCreateSchema>;
type Output = z.output<typeof InvitationCreateSchema>;

const emptyToUndefined = (v: unknown) => (v === '' ? undefined : v);
const ROLE_OPTIONS = ROLES.map((role) => ({ value: role, label: ROLE_LABELS[role] }));
const FIELDS = ['email', 'roles', 'displayName', 'dateOfBirth', 'sport'] as const;

export function InviteForm({ orgId }: { orgId: string }) {
  const create = useCreateInvitation(orgId);
  const [created, setCreated] = useState<InvitationDto | null>(null);
  // A new key after each success gives the next invitation a clean form, optional fields included.
  const [formKey, setFormKey] = useState(0);

  return (
    <div className="space-y-4">
      {created && <CreatedInvitation invitation={created} onDismiss={() => setCreated(null)} />}
      <InviteFields
        key={formKey}
        create={create}
        onCreated={(invitation) => {
          setCreated(invitation);
          setFormKey((k) => k + 1);
        }}
      />
    </div>
  );
}

function InviteFields({
  create,
  onCreated,
}: {
  create: ReturnType<typeof useCreateInvitation>;
  onCreated: (invitation: InvitationDto) => void;
}) {
  const {
    register,
    control,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<Input, unknown, Output>({
    resolver: zodResolver(InvitationCreateSchema),
    defaultValues: { email: '', roles: [] },
  });
  const roles = useWatch({ control, name: 'roles' });
  const forAthlete = roles.includes('athlete');

  const onSubmit = handleSubmit((values) =>
    create.mutate(values, {
      onSuccess: (invitation) => onCreated(invitation),
      onError: (error) => applyServerFieldErrors(error, setError, FIELDS),
    }),
  );

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label="Invite someone">
      <ErrorNotice error={create.error} />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="E-mail" type="email" autoComplete="off" error={errors.email?.message} {...register('email')} />
        <TextField
          label="Name (optional)"
          hint="Filled in for them; they can change it."
          autoComplete="off"
          error={errors.displayName?.message}
          {...register('displayName', { setValueAs: emptyToUndefined })}
        />
      </div>
      <Controller
        control={control}
        name="roles"
        render={({ field }) => (
          <CheckboxGroup
            legend="Roles"
            hint="A person may hold several roles."
            name={field.name}
            options={ROLE_OPTIONS}
            value={field.value}
            onChange={field.onChange}
            onBlur={field.onBlur}
            error={errors.roles?.message}
          />
        )}
      />
      {forAthlete && (
        <div className="grid gap-4 sm:grid-cols-2">
          <TextField
            label="Date of birth (optional)"
            type="date"
            hint="Marks a minor, who needs a linked guardian."
            error={errors.dateOfBirth?.message}
            {...register('dateOfBirth', { setValueAs: emptyToUndefined, shouldUnregister: true })}
          />
          <TextField
            label="Sport (optional)"
            autoComplete="off"
            error={errors.sport?.message}
            {...register('sport', { setValueAs: emptyToUndefined, shouldUnregister: true })}
          />
        </div>
      )}
      <Button type="submit" busy={create.isPending}>
        Create invitation
      </Button>
    </form>
  );
}

function CreatedInvitation({ invitation, onDismiss }: { invitation: InvitationDto; onDismiss: () => void }) {
  return (
    <Notice tone="done" role="status" title={`Invitation created for ${invitation.email}`}>
      {invitation.link ? (
        <div className="mt-2 space-y-2">
          <CopyField label="Invitation link" value={invitation.link} buttonLabel="Copy link" />
          <p>
            The invitation was e-mailed to {invitation.email}. The link is here too, to copy if the e-mail does not arrive. It works once,
            expires {formatDateTime(invitation.expiresAt)}, and is shown only now.
          </p>
        </div>
      ) : (
        <p>The link was not returned. Revoke this invitation and create a new one to get a link.</p>
      )}
      <Button variant="quiet" className="mt-2" onClick={onDismiss}>
        Done with this link
      </Button>
    </Notice>
  );
}
