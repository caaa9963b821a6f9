import { useId } from 'react';
import { useFormContext, useWatch } from 'react-hook-form';
import type { ExerciseDto } from '../../../../../policies/dto';
import type { EngineExercise } from '../../../../../policies/load/compliance';
import { toUnit } from '../../../../../policies/load/units';
import type { Unit } from '../../../../../policies/schemas';
import { Button } from '../../../components/ui/Button';
import { SelectField, TextField } from '../../../components/ui/Field';
import { LineBar } from '../../../components/ui/LineBar';
import { BreachList, type SetBreach } from './BreachList';
import type { LoadLine } from './live-check';
import { LOAD_UNITS, LOAD_UNIT_LABELS, type SessionForm } from './session-form';

export interface SetLine {
  athleteName: string | null;
  line: LoadLine;
}

const shown = (n: number) => String(Number(n.toFixed(2)));

/**
 * One planned set: reps, load and its unit, target RPE, rest, notes, the warm-up mark — then the
 * line it must stay under and, when it crosses, the breaches with their fixes. Named "Set N of
 * <exercise>". The warm-up box points to the builder's definition of a hard set (`hardSetHelpId`).
 */
export function SetRow({
  exerciseIndex,
  setIndex,
  exercise,
  exerciseName,
  unit,
  breaches,
  lines,
  exceptionWords,
  swapsFor,
  onSwap,
  onRemove,
  readOnly,
  hardSetHelpId,
}: {
  exerciseIndex: number;
  setIndex: number;
  exercise?: ExerciseDto;
  exerciseName: string;
  unit: Unit;
  breaches: SetBreach[];
  lines: SetLine[];
  exceptionWords: string | null;
  swapsFor: (item: SetBreach) => EngineExercise[];
  onSwap: (exerciseId: string) => void;
  onRemove: (() => void) | null;
  readOnly?: boolean;
  hardSetHelpId?: string;
}) {
  const { register, setValue, getFieldState, formState, control } = useFormContext<SessionForm>();
  const base = `exercises.${exerciseIndex}.sets.${setIndex}` as const;
  const n = setIndex + 1;
  const error = (field: 'reps' | 'load' | 'loadUnit' | 'targetRpe' | 'rest' | 'notes') =>
    getFieldState(`${base}.${field}`, formState).error?.message;
  const loadUnit = useWatch({ control, name: `${base}.loadUnit` });
  const plannedReps = Number(useWatch({ control, name: `${base}.reps` }));
  const warmUpId = useId();

  /** The breach's fix: the load that fits, and fewer reps when no load fits the planned ones. */
  function applyFix(value: number, fixUnit: 'kg' | 'lb', reps?: number) {
    setValue(`${base}.loadUnit`, fixUnit, { shouldDirty: true });
    setValue(`${base}.load`, String(value), { shouldDirty: true, shouldValidate: formState.isSubmitted });
    if (reps !== undefined) setValue(`${base}.reps`, String(reps), { shouldDirty: true, shouldValidate: formState.isSubmitted });
  }

  return (
    <fieldset className="min-w-0 border-t border-rule pt-2 first:border-t-0 first:pt-0" disabled={readOnly}>
      <legend className="sr-only">
        Set {n} of {exerciseName}
      </legend>
      <div className="flex flex-wrap items-end gap-x-2 gap-y-1">
        <span aria-hidden="true" className="w-12 pb-2.5 text-sm font-semibold tabular-nums">
          Set {n}
        </span>
        <TextField label="Reps" inputMode="numeric" className="w-16" error={error('reps')} {...register(`${base}.reps`)} />
        <TextField
          label="Load"
          inputMode="decimal"
          className="w-24"
          disabled={loadUnit === 'bodyweight'}
          error={error('load')}
          {...register(`${base}.load`)}
        />
        <SelectField label="Load unit" className="w-32" error={error('loadUnit')} {...register(`${base}.loadUnit`)}>
          {LOAD_UNITS.map((u) => (
            <option key={u} value={u}>
              {LOAD_UNIT_LABELS[u]}
            </option>
          ))}
        </SelectField>
        <TextField label="Target RPE" inputMode="decimal" className="w-20" error={error('targetRpe')} {...register(`${base}.targetRpe`)} />
        <TextField label="Rest (s)" inputMode="numeric" className="w-20" error={error('rest')} {...register(`${base}.rest`)} />
        <div className="flex items-center gap-2 pb-2.5">
          <input
            id={warmUpId}
            type="checkbox"
            className="size-5 shrink-0 accent-ink"
            aria-describedby={hardSetHelpId}
            {...register(`${base}.warmUp`)}
          />
          <label htmlFor={warmUpId} className="text-sm font-semibold">
            Warm-up
          </label>
        </div>
        <TextField label="Set notes" className="min-w-[8rem] flex-1" error={error('notes')} {...register(`${base}.notes`)} />
        {onRemove && !readOnly && (
          <Button size="sm" variant="quiet" className="mb-2" onClick={onRemove} aria-label={`Remove set ${n} of ${exerciseName}`}>
            Remove
          </Button>
        )}
      </div>
      {lines.length > 0 && (
        <div className="mt-1 grid gap-x-6 gap-y-1 pl-14 sm:grid-cols-2">
          {lines.map((l) => (
            <LineBar
              key={l.athleteName ?? 'one'}
              label={`Planned load, set ${n} of ${exerciseName}${l.athleteName ? `, ${l.athleteName}` : ''}, against its cap`}
              showLabel={!!l.athleteName}
              value={toUnit(l.line.plannedKg, unit)}
              limit={toUnit(l.line.capKg, unit)}
              unit={unit}
              format={shown}
            />
          ))}
        </div>
      )}
      {exceptionWords && <p className="mt-1 pl-14 text-sm font-semibold text-ink-2">{exceptionWords}</p>}
      <div className="pl-0 sm:pl-14">
        <BreachList
          items={breaches}
          exercise={exercise}
          reps={Number.isInteger(plannedReps) && plannedReps > 0 ? plannedReps : undefined}
          swapsFor={swapsFor}
          onUseLoad={readOnly ? undefined : applyFix}
          onSwap={readOnly ? undefined : onSwap}
        />
      </div>
    </fieldset>
  );
}
