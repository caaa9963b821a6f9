import { useEffect } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { AthleteProfileUpdateSchema } from '../../../../../policies/schemas';
import type { AthleteProfileDto } from '../../../../../policies/dto';
import { isApiError } from '../../../lib/api-client';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { queryKeys } from '../../../lib/query-keys';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { useUpdateAthlete } from '../api/update-athlete';

type Input = z.input<typeof AthleteProfileUpdateSchema>;
type Output = z.output<typeof AthleteProfileUpdateSchema>;

/** An emptied box clears the value on the server. */
const emptyToNull = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? null : v);

function startingValues(athlete: AthleteProfileDto): Input {
  return {
    dateOfBirth: athlete.dateOfBirth,
    sport: athlete.sport,
    position: athlete.position,
    version: athlete.version,
  };
}

export function AthleteProfileForm({ orgId, athlete, staleMessage }: { orgId: string; athlete: AthleteProfileDto; staleMessage: string }) {
  const queryClient = useQueryClient();
  const update = useUpdateAthlete(orgId, athlete.id);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isDirty },
  } = useForm<Input, unknown, Output>({
    resolver: zodResolver(AthleteProfileUpdateSchema),
    defaultValues: startingValues(athlete),
  });

  useEffect(() => {
    reset(startingValues(athlete));
  }, [athlete, reset]);

  const stale = isApiError(update.error) && update.error.code === 'version_conflict';
  const onSubmit = handleSubmit((values) =>
    update.mutate(values, {
      onError: (error) => applyServerFieldErrors(error, setError, ['dateOfBirth', 'sport', 'position']),
    }),
  );

  async function reload() {
    await queryClient.invalidateQueries({ queryKey: queryKeys.org(orgId) });
    update.reset();
  }

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-3">
      {stale ? (
        <Notice tone="problem" role="alert" title="Not saved">
          <p>{staleMessage}</p>
          <Button variant="secondary" size="sm" className="mt-2" onClick={() => void reload()}>
            Reload this person
          </Button>
        </Notice>
      ) : (
        <ErrorNotice error={update.error} />
      )}
      {update.isSuccess && !isDirty && (
        <Notice tone="done" role="status">
          <p>Athlete details saved.</p>
        </Notice>
      )}
      <div className="grid gap-3 sm:grid-cols-3">
        <TextField
          label="Date of birth"
          type="date"
          error={errors.dateOfBirth?.message}
          {...register('dateOfBirth', { setValueAs: emptyToNull })}
        />
        <TextField label="Sport" error={errors.sport?.message} {...register('sport', { setValueAs: emptyToNull })} />
        <TextField label="Position" error={errors.position?.message} {...register('position', { setValueAs: emptyToNull })} />
      </div>
      <Button type="submit" busy={update.isPending} disabled={!isDirty}>
        Save athlete details
      </Button>
    </form>
  );
}
