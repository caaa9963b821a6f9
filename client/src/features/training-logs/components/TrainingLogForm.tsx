import { useEffect, useRef } from 'react';
import { useFieldArray, useForm, useWatch } from 'react-hook-form';
import type { TrainingLogOutcomeDto } from '../../../../../policies/dto';
import type { TrainingLogCreateInput, Unit } from '../../../../../policies/schemas';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { emptyToUndefined } from '../../../lib/form-values';
import { todayLocal } from '../../../lib/dates';
import { Button } from '../../../components/ui/Button';
import { TextAreaField, TextField } from '../../../components/ui/Field';
import { ErrorNotice } from '../../../components/ui/Notice';
import { ScoreField } from '../../../components/ui/ScoreField';
import { useCreateTrainingLog } from '../api/create-training-log';
import { EMPTY_SET, logFormResolver, toNumber, toNumberOrNull, type LogFormValues, type SetRow } from './log-form';
import { SessionEffortField } from './SessionEffortField';

const FIELDS = ['date', 'durationMinutes', 'sessionRpe', 'painBefore', 'painDuring', 'painAfter', 'sets', 'notes'] as const;

/**
 * Logging a session: when, how long, how hard, pain before and during, and the sets. Loads are typed
 * in the athlete's unit and sent in kg. On success the parent shows the pain rule's answer.
 */
export function TrainingLogForm({
  orgId,
  athleteId,
  unit,
  painCeiling,
  plan,
  onSaved,
  onKept,
}: {
  orgId: string;
  athleteId: string;
  unit: Unit;
  /** The clinician's ceiling in force today, when known; pain scores past it are marked. */
  painCeiling?: number;
  /** "Log this session": the planned session's sets, pre-filled to be edited to what was done. */
  plan?: { sessionId: string; sets: SetRow[] };
  onSaved: (outcome: TrainingLogOutcomeDto) => void;
  /** Loadline could not be reached: the log is kept on the phone and sent later (lib/offline-queue.ts). */
  onKept?: () => void;
}) {
  const save = useCreateTrainingLog(orgId);
  const today = todayLocal();
  const lastSetRef = useRef<HTMLInputElement | null>(null);
  const focusNewSet = useRef(false);
  const {
    control,
    register,
    handleSubmit,
    setError,
    setValue,
    getValues,
    formState: { errors, isSubmitted },
  } = useForm<LogFormValues, unknown, TrainingLogCreateInput>({
    resolver: logFormResolver(unit),
    defaultValues: { athleteId, date: today, sets: plan?.sets ?? [], ...(plan ? { sessionId: plan.sessionId } : {}) },
  });
  const sets = useFieldArray({ control, name: 'sets' });
  const effort = useWatch({ control, name: 'sessionRpe' });
  const painAfter = useWatch({ control, name: 'painAfter' });

  useEffect(() => {
    if (focusNewSet.current) {
      focusNewSet.current = false;
      lastSetRef.current?.focus();
    }
  }, [sets.fields.length]);

  function addSet() {
    // A new set starts as a copy of the one before (same lift, same load): most sessions repeat sets.
    const previous = getValues('sets').at(-1);
    focusNewSet.current = true;
    sets.append(previous ? { ...previous, rpe: null } : EMPTY_SET, { shouldFocus: false });
  }

  const onSubmit = handleSubmit((values) =>
    save.mutate(values, {
      onSuccess: (result) => ('sent' in result ? onSaved(result.sent) : onKept?.()),
      onError: (error) => applyServerFieldErrors(error, setError, [...FIELDS]),
    }),
  );

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Log a session" className="space-y-6">
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Session date" type="date" large max={today} error={errors.date?.message} {...register('date')} />
        <TextField
          label="Duration (minutes)"
          type="number"
          inputMode="numeric"
          min={1}
          max={600}
          large
          error={errors.durationMinutes?.message}
          {...register('durationMinutes', { setValueAs: toNumber })}
        />
      </div>
      <SessionEffortField
        value={effort}
        onPick={(score) => setValue('sessionRpe', score, { shouldValidate: isSubmitted })}
        error={errors.sessionRpe?.message}
        input={register('sessionRpe', { setValueAs: toNumber })}
      />
      <ScoreField
        control={control}
        name="painBefore"
        label="Pain before"
        hint="Before you started."
        low="No pain"
        high="Worst pain you can imagine"
        error={errors.painBefore?.message}
      />
      <ScoreField
        control={control}
        name="painDuring"
        label="Pain during"
        hint="The most it hurt during the session."
        low="No pain"
        high="Worst pain you can imagine"
        limit={painCeiling}
        error={errors.painDuring?.message}
      />
      <div className="space-y-1">
        <ScoreField
          control={control}
          name="painAfter"
          label="Pain after the session (this evening)"
          hint="Optional now. Just finished training? Leave it: your page will ask you this evening."
          low="No pain"
          high="Worst pain you can imagine"
          limit={painCeiling}
          error={errors.painAfter?.message}
        />
        {painAfter !== undefined && (
          <Button variant="quiet" size="sm" onClick={() => setValue('painAfter', undefined)}>
            Clear pain after — answer it later
          </Button>
        )}
      </div>

      <fieldset className="min-w-0 space-y-3">
        <legend className="text-base font-semibold">Sets</legend>
        <p className="text-sm text-muted">
          One row per set. Load in {unit}; 0 for body weight. RPE is how hard the set felt: 10 means no more reps left.
        </p>
        {sets.fields.length === 0 && <p className="text-sm text-ink-2">No sets yet. Conditioning or practice only? Leave this empty.</p>}
        <ol className="space-y-3">
          {sets.fields.map((field, i) => {
            const rowErrors = errors.sets?.[i];
            const { ref, ...exercise } = register(`sets.${i}.exercise`);
            return (
              <li key={field.id}>
                <fieldset className="min-w-0 rounded-lg border border-rule bg-sheet p-3">
                  <legend className="px-1 text-sm font-semibold">Set {i + 1}</legend>
                  <div className="grid grid-cols-3 gap-2">
                    <TextField
                      label="Exercise"
                      large
                      autoComplete="off"
                      // A set from the plan names its library exercise: the limits are checked against it.
                      readOnly={!!field.exerciseId}
                      className="col-span-3"
                      error={rowErrors?.exercise?.message}
                      ref={(el) => {
                        ref(el);
                        if (i === sets.fields.length - 1) lastSetRef.current = el;
                      }}
                      {...exercise}
                    />
                    <TextField
                      label="Load"
                      hint={unit}
                      type="number"
                      inputMode="decimal"
                      min={0}
                      step="any"
                      large
                      error={rowErrors?.load?.message}
                      {...register(`sets.${i}.load`, { setValueAs: toNumber })}
                    />
                    <TextField
                      label="Reps"
                      hint="count"
                      type="number"
                      inputMode="numeric"
                      min={0}
                      large
                      error={rowErrors?.reps?.message}
                      {...register(`sets.${i}.reps`, { setValueAs: toNumber })}
                    />
                    <TextField
                      label="RPE (optional)"
                      hint="1–10"
                      type="number"
                      inputMode="decimal"
                      min={1}
                      max={10}
                      step={0.5}
                      large
                      error={rowErrors?.rpe?.message}
                      {...register(`sets.${i}.rpe`, { setValueAs: toNumberOrNull })}
                    />
                  </div>
                  <Button variant="quiet" size="sm" className="mt-2" onClick={() => sets.remove(i)}>
                    Remove set {i + 1}
                  </Button>
                </fieldset>
              </li>
            );
          })}
        </ol>
        {errors.sets?.message && <p className="text-sm font-semibold text-line-deep">Sets {errors.sets.message}</p>}
        <div className="flex flex-col gap-2 sm:flex-row">
          <Button variant="secondary" size="lg" onClick={addSet}>
            Add a set
          </Button>
          {plan && (
            <Button
              variant="secondary"
              size="lg"
              onClick={() => {
                focusNewSet.current = true;
                sets.append(EMPTY_SET, { shouldFocus: false });
              }}
            >
              Add another exercise
            </Button>
          )}
        </div>
      </fieldset>

      <TextAreaField
        label="Notes (optional)"
        hint="Anything your coach or clinician should know about this session."
        large
        error={errors.notes?.message}
        {...register('notes', { setValueAs: emptyToUndefined })}
      />
      <ErrorNotice error={save.error} title="Session not saved" />
      <Button type="submit" size="lg" busy={save.isPending}>
        Save session
      </Button>
    </form>
  );
}
