import { useMemo } from 'react';
import { Controller, useForm, useWatch, type FieldErrors, type Resolver } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { BaselineDto, ExerciseDto } from '../../../../../policies/dto';
import { estimateOneRm, oneRmProblem, type OneRmEstimate } from '../../../../../policies/load/one-rm';
import { formatLoad, fromUnit } from '../../../../../policies/load/units';
import { BaselineCreateSchema, type BaselineCreateInput, type Unit } from '../../../../../policies/schemas';
import { Button } from '../../../components/ui/Button';
import { RadioGroup, SelectField, TextField } from '../../../components/ui/Field';
import { ErrorNotice } from '../../../components/ui/Notice';
import { todayLocal } from '../../../lib/dates';
import { useRecordBaseline } from '../api/baselines';

interface BaselineFormValues {
  exerciseId: string;
  kind: 'tested' | 'estimated';
  load: string;
  reps: string;
  rpe: string;
  testedOn: string;
}

const num = (t: string) => (t.trim() === '' ? undefined : Number(t.trim().replace(',', '.')));

function toPayload(v: BaselineFormValues, unit: Unit): BaselineCreateInput {
  const load = num(v.load);
  return {
    exerciseId: v.exerciseId,
    kind: v.kind,
    loadKg: load === undefined ? (undefined as never) : fromUnit(load, unit),
    reps: v.kind === 'tested' ? 1 : (num(v.reps) as number),
    rpe: v.kind === 'tested' ? null : (num(v.rpe) ?? null),
    testedOn: v.testedOn,
  };
}

type Preview = { estimate: OneRmEstimate; done: number; rir: number } | { sentence: string };

/**
 * What the live preview shows: the estimate, or a sentence saying what is missing or cannot be read
 * (an RPE of 0 or "abc" is said in words, never shown as NaN). The same checks as estimateOneRm.
 */
function previewOf(
  kind: BaselineFormValues['kind'],
  load: number | undefined,
  reps: number | undefined,
  rpe: number | undefined,
  unit: Unit,
): Preview {
  if (load === undefined) return { sentence: `Type a load${kind === 'estimated' ? ' and reps' : ''} to see the 1RM.` };
  const loadKg = fromUnit(load, unit);
  const done = kind === 'tested' ? 1 : (reps ?? Number.NaN);
  const problem = oneRmProblem(loadKg, done, kind === 'tested' ? null : (rpe ?? null), 'epley');
  const estimate = problem ? null : estimateOneRm(loadKg, done, kind === 'tested' ? null : (rpe ?? null), 'epley');
  if (!estimate) return { sentence: problem?.message ?? 'The 1RM cannot be estimated from these numbers.' };
  return { estimate, done, rir: estimate.reps - done };
}

/** The shared schema, on exactly what would be sent; loadKg's message goes to the Load field. */
function resolverFor(unit: Unit): Resolver<BaselineFormValues, unknown, BaselineCreateInput> {
  const schema = zodResolver(BaselineCreateSchema);
  return async (values, context, options) => {
    const result = await schema(toPayload(values, unit) as never, context, options as never);
    const errors = result.errors as FieldErrors & { loadKg?: unknown };
    if (errors.loadKg) {
      (errors as Record<string, unknown>).load = errors.loadKg;
      delete errors.loadKg;
    }
    if (Object.keys(errors).length > 0) return { values: {}, errors: errors as FieldErrors<BaselineFormValues> };
    return { values: result.values as BaselineCreateInput, errors: {} };
  };
}

/**
 * A tested 1RM (one rep) or a set to estimate it from. The Epley estimate (reps in reserve added when
 * an RPE is given) shows as the numbers are typed — the server works it out the same way — or, when
 * the numbers cannot give one, a sentence saying why.
 */
export function BaselineForm({
  orgId,
  athleteId,
  unit,
  library,
  onSaved,
  onCancel,
}: {
  orgId: string;
  athleteId: string;
  unit: Unit;
  library: ExerciseDto[];
  onSaved: (baseline: BaselineDto) => void;
  onCancel: () => void;
}) {
  const record = useRecordBaseline(orgId, athleteId);
  const { control, register, handleSubmit, formState } = useForm<BaselineFormValues, unknown, BaselineCreateInput>({
    resolver: useMemo(() => resolverFor(unit), [unit]),
    defaultValues: { exerciseId: library[0]?.id ?? '', kind: 'estimated', load: '', reps: '5', rpe: '', testedOn: todayLocal() },
  });
  const [kind, load, reps, rpe] = useWatch({ control, name: ['kind', 'load', 'reps', 'rpe'] });
  const preview = previewOf(kind, num(load ?? ''), num(reps ?? ''), num(rpe ?? ''), unit);

  const onSubmit = handleSubmit((input) => record.mutate(input, { onSuccess: onSaved }));

  return (
    <form
      onSubmit={onSubmit}
      noValidate
      aria-label="Record a 1RM or a set"
      className="space-y-3 rounded-lg border border-rule-strong bg-sheet p-4"
    >
      <div className="flex flex-wrap gap-3">
        <SelectField label="Lift" className="min-w-[12rem] flex-1" error={formState.errors.exerciseId?.message} {...register('exerciseId')}>
          {library.map((e) => (
            <option key={e.id} value={e.id}>
              {e.name}
            </option>
          ))}
        </SelectField>
        <TextField label="Date" type="date" className="w-44" error={formState.errors.testedOn?.message} {...register('testedOn')} />
      </div>
      <Controller
        control={control}
        name="kind"
        render={({ field }) => (
          <RadioGroup
            legend="What was lifted"
            name={field.name}
            options={[
              { value: 'estimated', label: 'A set (reps, optional RPE)', hint: 'The 1RM is estimated from it' },
              { value: 'tested', label: 'A tested 1RM', hint: 'One rep at the heaviest load' },
            ]}
            value={field.value}
            onChange={field.onChange}
            onBlur={field.onBlur}
          />
        )}
      />
      <div className="flex flex-wrap gap-3">
        <TextField
          label={`Load (${unit})`}
          inputMode="decimal"
          className="w-28"
          error={formState.errors.load?.message}
          {...register('load')}
        />
        {kind === 'estimated' && (
          <>
            <TextField label="Reps" inputMode="numeric" className="w-20" error={formState.errors.reps?.message} {...register('reps')} />
            <TextField
              label="RPE (optional)"
              inputMode="decimal"
              className="w-28"
              error={formState.errors.rpe?.message}
              {...register('rpe')}
            />
          </>
        )}
      </div>
      <p aria-live="polite" className="text-sm tabular-nums">
        {'estimate' in preview ? (
          <>
            <span className="font-semibold">
              {kind === 'tested' ? '1RM' : 'Estimated 1RM'}: {formatLoad(preview.estimate.value, unit)}
            </span>
            {kind === 'estimated' && (
              <span className="text-ink-2">
                {' '}
                (Epley, {preview.estimate.reps} reps{preview.rir > 0 ? ` — ${preview.done} done + ${preview.rir} in reserve` : ''})
              </span>
            )}
            {preview.estimate.lowReliability && (
              <span className="block font-semibold text-line-deep">
                ▲ Low reliability: estimates from more than 10 reps can be far off. A heavier set gives a better number.
              </span>
            )}
          </>
        ) : (
          <span className="text-muted">{preview.sentence}</span>
        )}
      </p>
      {record.isError && <ErrorNotice error={record.error} />}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={record.isPending}>
          Save
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
