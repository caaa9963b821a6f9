import { Controller, useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { ProfileUpdateSchema } from '../../../../../policies/schemas';
import type { UserDto } from '../../../../../policies/dto';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { Button } from '../../../components/ui/Button';
import { RadioGroup, TextField } from '../../../components/ui/Field';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { useUpdateProfile } from '../api/update-profile';

type Input = z.input<typeof ProfileUpdateSchema>;
type Output = z.output<typeof ProfileUpdateSchema>;

const UNIT_OPTIONS = [
  { value: 'kg', label: 'Kilograms (kg)' },
  { value: 'lb', label: 'Pounds (lb)' },
] as const;

export function AccountForm({ user }: { user: UserDto }) {
  const update = useUpdateProfile();
  const {
    register,
    control,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isDirty },
  } = useForm<Input, unknown, Output>({
    resolver: zodResolver(ProfileUpdateSchema),
    defaultValues: { displayName: user.displayName, unitPref: user.unitPref },
  });

  const onSubmit = handleSubmit((values) =>
    update.mutate(values, {
      onSuccess: (saved) => reset({ displayName: saved.displayName, unitPref: saved.unitPref }),
      onError: (error) => applyServerFieldErrors(error, setError, ['displayName', 'unitPref']),
    }),
  );

  return (
    <form onSubmit={onSubmit} noValidate className="max-w-md space-y-4">
      <ErrorNotice error={update.error} />
      {update.isSuccess && !isDirty && (
        <Notice tone="done" role="status">
          <p>Your account is saved.</p>
        </Notice>
      )}
      <TextField
        label="Display name"
        hint="How your name appears to your care team and in the audit trail."
        autoComplete="name"
        error={errors.displayName?.message}
        {...register('displayName')}
      />
      <Controller
        control={control}
        name="unitPref"
        render={({ field }) => (
          <RadioGroup
            legend="Units for loads"
            hint="Loads are stored in kilograms and shown to you in the unit you pick, converted exactly."
            name={field.name}
            options={UNIT_OPTIONS}
            value={field.value}
            onChange={field.onChange}
            onBlur={field.onBlur}
            error={errors.unitPref?.message}
          />
        )}
      />
      <Button type="submit" busy={update.isPending}>
        Save account
      </Button>
    </form>
  );
}
