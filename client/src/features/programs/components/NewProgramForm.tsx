import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useNavigate } from 'react-router-dom';
import { ProgramCreateSchema, type ProgramCreateInput } from '../../../../../policies/schemas';
import { Button } from '../../../components/ui/Button';
import { CheckboxGroup, TextField } from '../../../components/ui/Field';
import { ErrorNotice } from '../../../components/ui/Notice';
import { useCreateProgram } from '../api/create-program';

export const programHref = (programId: string) => `/coach/programs/${programId}`;

/**
 * "New program": a name and the athletes it is for (one, or a group — every set is then checked
 * for each of them). Opens the new program on success.
 */
export function NewProgram({
  orgId,
  athletes,
  preset = [],
}: {
  orgId: string;
  athletes: { id: string; name: string }[];
  preset?: string[];
}) {
  const [open, setOpen] = useState(false);
  if (!open) {
    return (
      <Button onClick={() => setOpen(true)} disabled={athletes.length === 0}>
        New program
      </Button>
    );
  }
  return <NewProgramForm orgId={orgId} athletes={athletes} preset={preset} onCancel={() => setOpen(false)} />;
}

function NewProgramForm({
  orgId,
  athletes,
  preset,
  onCancel,
}: {
  orgId: string;
  athletes: { id: string; name: string }[];
  preset: string[];
  onCancel: () => void;
}) {
  const navigate = useNavigate();
  const create = useCreateProgram(orgId);
  const { control, register, handleSubmit, formState } = useForm<ProgramCreateInput>({
    resolver: zodResolver(ProgramCreateSchema),
    defaultValues: { name: '', athleteIds: preset },
  });
  const onSubmit = handleSubmit((input) => create.mutate(input, { onSuccess: (p) => navigate(programHref(p.id)) }));

  return (
    <form
      onSubmit={onSubmit}
      noValidate
      aria-label="New program"
      className="w-full space-y-3 rounded-lg border border-rule-strong bg-sheet p-4"
    >
      <TextField
        label="Program name"
        placeholder="e.g. Return to lifting, block 1"
        error={formState.errors.name?.message}
        autoFocus
        {...register('name')}
      />
      <Controller
        control={control}
        name="athleteIds"
        render={({ field }) => (
          <CheckboxGroup
            legend="For"
            hint="One athlete, or several for a group program. Each set is checked against each athlete's limits."
            name={field.name}
            options={athletes.map((a) => ({ value: a.id, label: a.name }))}
            value={field.value}
            onChange={field.onChange}
            onBlur={field.onBlur}
            error={formState.errors.athleteIds?.message}
          />
        )}
      />
      {create.isError && <ErrorNotice error={create.error} />}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={create.isPending}>
          Create program
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
