import { useFieldArray, useFormContext } from 'react-hook-form';
import type { ExerciseDto } from '../../../../../policies/dto';
import type { EngineExercise } from '../../../../../policies/load/compliance';
import type { Unit } from '../../../../../policies/schemas';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { Badge } from '../../../components/ui/Panel';
import type { SetBreach } from './BreachList';
import { patternWords } from './program-words';
import { blankSet, schemeToSetForms, type SessionForm } from './session-form';
import { SetSchemeEntry } from './SetSchemeEntry';
import { SetRow, type SetLine } from './SetRow';

const MAX_SETS = 30;

/**
 * One exercise of the session with its sets. Order moves with up/down buttons (no dragging, so it
 * works the same by keyboard and on a phone).
 */
export function ExerciseBlock({
  index,
  count,
  exercise,
  unit,
  breachesFor,
  linesFor,
  exceptionFor,
  swapsFor,
  onMove,
  onRemove,
  readOnly,
  hardSetHelpId,
}: {
  index: number;
  count: number;
  exercise?: ExerciseDto;
  unit: Unit;
  breachesFor: (setId: string) => SetBreach[];
  linesFor: (setId: string) => SetLine[];
  exceptionFor: (setId: string) => string | null;
  swapsFor: (item: SetBreach) => EngineExercise[];
  onMove: (to: number) => void;
  onRemove: () => void;
  readOnly?: boolean;
  /** The id of the builder's definition of a hard set, which each set's warm-up box points to. */
  hardSetHelpId?: string;
}) {
  const { control, register, setValue, getValues } = useFormContext<SessionForm>();
  const { fields, append, remove, replace } = useFieldArray({ control, name: `exercises.${index}.sets` });
  const name = exercise?.name ?? 'Unknown exercise';

  return (
    <li className="rounded-lg border border-rule bg-sheet p-3">
      <div className="mb-2 flex flex-wrap items-start justify-between gap-2">
        <div className="min-w-0">
          <h3 className="font-bold">
            <span className="mr-1.5 text-muted tabular-nums">{index + 1}.</span>
            {name}
          </h3>
          <p className="text-xs text-muted">
            {exercise ? patternWords(exercise) : 'not in the library'}
            {exercise?.ballistic && ' · impact'}
            {exercise?.archived && (
              <>
                {' '}
                <Badge>Archived</Badge>
              </>
            )}
          </p>
        </div>
        {!readOnly && (
          <div className="flex flex-wrap gap-1">
            <Button size="sm" variant="secondary" disabled={index === 0} onClick={() => onMove(index - 1)} aria-label={`Move ${name} up`}>
              ↑ Up
            </Button>
            <Button
              size="sm"
              variant="secondary"
              disabled={index === count - 1}
              onClick={() => onMove(index + 1)}
              aria-label={`Move ${name} down`}
            >
              ↓ Down
            </Button>
            <Button size="sm" variant="danger" onClick={onRemove} aria-label={`Remove ${name}`}>
              Remove
            </Button>
          </div>
        )}
      </div>
      <div className="space-y-2">
        {fields.map((field, j) => {
          const setId = getValues(`exercises.${index}.sets.${j}.setId`) ?? field.setId;
          return (
            <SetRow
              key={field.id}
              exerciseIndex={index}
              setIndex={j}
              exercise={exercise}
              exerciseName={name}
              unit={unit}
              breaches={breachesFor(setId)}
              lines={linesFor(setId)}
              exceptionWords={exceptionFor(setId)}
              swapsFor={swapsFor}
              onSwap={(id) => setValue(`exercises.${index}.exerciseId`, id, { shouldDirty: true })}
              onRemove={fields.length > 1 ? () => remove(j) : null}
              readOnly={readOnly}
              hardSetHelpId={hardSetHelpId}
            />
          );
        })}
      </div>
      {!readOnly && (
        <div className="mt-2 flex flex-wrap items-end gap-3">
          <Button
            size="sm"
            variant="secondary"
            disabled={fields.length >= MAX_SETS}
            onClick={() => {
              const sets = getValues(`exercises.${index}.sets`);
              append(blankSet(unit, sets[sets.length - 1]));
            }}
            aria-label={`Add a set to ${name}`}
          >
            + Set
          </Button>
          <TextField label={`Notes for ${name}`} className="min-w-[12rem] flex-1" {...register(`exercises.${index}.notes`)} />
        </div>
      )}
      {!readOnly && (
        <div className="mt-2">
          <SetSchemeEntry exerciseName={name} onUse={(sets) => replace(schemeToSetForms(sets, getValues(`exercises.${index}.sets`)))} />
        </div>
      )}
    </li>
  );
}
