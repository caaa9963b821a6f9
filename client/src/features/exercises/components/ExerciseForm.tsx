import { Controller, useForm, useWatch } from 'react-hook-form';
import type { ExerciseDto } from '../../../../../policies/dto';
import { MOVEMENT_PATTERNS, PATTERN_LABELS } from '../../../../../policies/load/patterns';
import { KETTLEBELL_KG } from '../../../../../policies/load/steps';
import { EQUIPMENT, type ExerciseCreateInput } from '../../../../../policies/schemas';
import { isApiError } from '../../../lib/api-client';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { Button } from '../../../components/ui/Button';
import { CheckboxGroup, RadioGroup, SelectField, TextField } from '../../../components/ui/Field';
import { ErrorNotice } from '../../../components/ui/Notice';
import { useCreateExercise, useUpdateExercise } from '../api/exercises';
import { BLANK_EXERCISE, exerciseFormResolver, exerciseToForm, type ExerciseFormValues } from './exercise-form';
import { EQUIPMENT_LABELS } from './exercise-words';
import { UseInsteadPicker } from './UseInsteadPicker';

const STALE =
  'Someone changed this exercise after you opened it, so your changes were not saved. Close the form, open it again and redo your change.';

/** Adds an exercise to the library, or edits one (sent with the version it was opened at). */
export function ExerciseForm({
  orgId,
  exercise,
  library,
  onDone,
  onCancel,
}: {
  orgId: string;
  exercise?: ExerciseDto;
  library: ExerciseDto[];
  onDone: (saved: ExerciseDto) => void;
  onCancel: () => void;
}) {
  const create = useCreateExercise(orgId);
  const update = useUpdateExercise(orgId);
  const mutation = exercise ? update : create;
  const { control, register, handleSubmit, setError, formState } = useForm<ExerciseFormValues, unknown, ExerciseCreateInput>({
    resolver: exerciseFormResolver,
    defaultValues: exercise ? exerciseToForm(exercise) : BLANK_EXERCISE,
  });
  const stepsKind = useWatch({ control, name: 'stepsKind' });
  const e = formState.errors;
  // A list's error sits on the list (too many, twice the same) or on one of its entries (not an id).
  const useInsteadError =
    e.useInstead?.message ?? (Array.isArray(e.useInstead) ? e.useInstead.find((x) => x?.message)?.message : undefined);

  const onError = (error: unknown) =>
    applyServerFieldErrors(error, setError, ['name', 'patterns', 'equipment', 'ballistic', 'referenceId', 'useInstead']);
  const onSubmit = handleSubmit((input) => {
    if (exercise) update.mutate({ id: exercise.id, input: { ...input, version: exercise.version } }, { onSuccess: onDone, onError });
    else create.mutate(input, { onSuccess: onDone, onError });
  });
  const stale = isApiError(mutation.error) && mutation.error.code === 'version_conflict';

  return (
    <form onSubmit={onSubmit} noValidate aria-label={exercise ? `Edit ${exercise.name}` : 'Add an exercise'} className="space-y-4">
      <div className="grid gap-3 sm:grid-cols-[minmax(0,1fr)_12rem]">
        <TextField label="Name" error={e.name?.message} {...register('name')} />
        <SelectField label="Equipment" error={e.equipment?.message} {...register('equipment')}>
          {EQUIPMENT.map((q) => (
            <option key={q} value={q}>
              {EQUIPMENT_LABELS[q]}
            </option>
          ))}
        </SelectField>
      </div>
      <Controller
        control={control}
        name="patterns"
        render={({ field }) => (
          <CheckboxGroup
            legend="Movement patterns"
            hint="Up to four. A limit on any of them applies to this exercise."
            name={field.name}
            options={MOVEMENT_PATTERNS.map((p) => ({ value: p, label: PATTERN_LABELS[p] }))}
            value={field.value}
            onChange={field.onChange}
            onBlur={field.onBlur}
            error={e.patterns?.message}
          />
        )}
      />
      <Controller
        control={control}
        name="ballistic"
        render={({ field }) => (
          <RadioGroup
            legend="Ballistic or impact"
            hint="Jumps, landings, throws, sprints: refused on days a plan allows no impact."
            name={field.name}
            options={[
              { value: 'no', label: 'No' },
              { value: 'yes', label: 'Yes' },
            ]}
            value={field.value}
            onChange={field.onChange}
            onBlur={field.onBlur}
            error={e.ballistic?.message}
          />
        )}
      />
      <fieldset className="space-y-2">
        <legend className="text-sm font-semibold">Available weight increments</legend>
        <p className="text-sm text-muted">The loads this exercise can really be set to; a load over a limit is rounded down onto them.</p>
        <Controller
          control={control}
          name="stepsKind"
          render={({ field }) => (
            <RadioGroup
              legend="Kind of increments"
              name={field.name}
              options={[
                { value: 'increment', label: 'A fixed increment' },
                { value: 'list', label: 'Kettlebell sizes' },
              ]}
              value={field.value}
              onChange={field.onChange}
              onBlur={field.onBlur}
            />
          )}
        />
        {stepsKind === 'increment' ? (
          <div className="flex flex-wrap gap-3">
            <TextField label="Step" inputMode="decimal" className="w-24" error={e.step?.message} {...register('step')} />
            <SelectField label="Step unit" className="w-24" {...register('stepUnit')}>
              <option value="kg">kg</option>
              <option value="lb">lb</option>
            </SelectField>
          </div>
        ) : (
          <Controller
            control={control}
            name="sizes"
            render={({ field }) => (
              <CheckboxGroup
                legend="Sizes available (kg)"
                name={field.name}
                options={KETTLEBELL_KG.map((kg) => ({ value: String(kg), label: `${kg}` }))}
                value={field.value}
                onChange={field.onChange}
                onBlur={field.onBlur}
                error={e.sizes?.message}
              />
            )}
          />
        )}
      </fieldset>
      <SelectField
        label="Reference lift"
        hint="The lift whose 1RM sets this exercise's % loads, e.g. Romanian deadlift from Deadlift."
        error={e.referenceId?.message}
        {...register('referenceId')}
      >
        <option value="">Its own 1RM</option>
        {library
          .filter((x) => x.id !== exercise?.id && !x.archived)
          .map((x) => (
            <option key={x.id} value={x.id}>
              {x.name}
            </option>
          ))}
      </SelectField>
      <Controller
        control={control}
        name="useInstead"
        render={({ field }) => (
          <UseInsteadPicker value={field.value} onChange={field.onChange} library={library} selfId={exercise?.id} error={useInsteadError} />
        )}
      />
      {mutation.isError && <ErrorNotice error={mutation.error} wording={{ versionConflict: STALE }} />}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={mutation.isPending} disabled={stale}>
          {exercise ? 'Save exercise' : 'Add to the library'}
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
