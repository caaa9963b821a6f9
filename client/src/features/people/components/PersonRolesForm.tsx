import { useEffect } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { MembershipUpdateSchema } from '../../../../../policies/schemas';
import { ROLES, ROLE_LABELS } from '../../../../../policies/roles';
import type { PersonDto } from '../../../../../policies/dto';
import { isApiError } from '../../../lib/api-client';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { queryKeys } from '../../../lib/query-keys';
import { Button } from '../../../components/ui/Button';
import { CheckboxGroup } from '../../../components/ui/Field';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { useUpdatePersonRoles } from '../api/update-person-roles';

type Input = z.input<typeof MembershipUpdateSchema>;
type Output = z.output<typeof MembershipUpdateSchema>;

export const STALE_PERSON = 'Someone else changed this person; reload to see the latest.';
const ROLE_OPTIONS = ROLES.map((role) => ({ value: role, label: ROLE_LABELS[role] }));

export function PersonRolesForm({ orgId, person }: { orgId: string; person: PersonDto }) {
  const queryClient = useQueryClient();
  const update = useUpdatePersonRoles(orgId, person.id);
  const {
    control,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isDirty },
  } = useForm<Input, unknown, Output>({
    resolver: zodResolver(MembershipUpdateSchema),
    defaultValues: { roles: person.roles, version: person.version },
  });

  // A fresh copy of the person (after a save or a reload) becomes the form's new starting point.
  useEffect(() => {
    reset({ roles: person.roles, version: person.version });
  }, [person.roles, person.version, reset]);

  const stale = isApiError(update.error) && update.error.code === 'version_conflict';

  const onSubmit = handleSubmit((values) =>
    update.mutate(values, { onError: (error) => applyServerFieldErrors(error, setError, ['roles']) }),
  );

  async function reload() {
    await queryClient.invalidateQueries({ queryKey: queryKeys.person(orgId, person.id) });
    update.reset();
  }

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-3">
      {stale ? (
        <Notice tone="problem" role="alert" title="Not saved">
          <p>{STALE_PERSON}</p>
          <Button variant="secondary" size="sm" className="mt-2" onClick={() => void reload()}>
            Reload this person
          </Button>
        </Notice>
      ) : (
        <ErrorNotice error={update.error} />
      )}
      {update.isSuccess && !isDirty && (
        <Notice tone="done" role="status">
          <p>Roles saved.</p>
        </Notice>
      )}
      <Controller
        control={control}
        name="roles"
        render={({ field }) => (
          <CheckboxGroup
            legend="Roles"
            name={field.name}
            options={ROLE_OPTIONS}
            value={field.value}
            onChange={field.onChange}
            onBlur={field.onBlur}
            error={errors.roles?.message}
          />
        )}
      />
      <Button type="submit" busy={update.isPending} disabled={!isDirty}>
        Save roles
      </Button>
    </form>
  );
}
