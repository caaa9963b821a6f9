import { useId, useState } from 'react';
import type { ExerciseDto } from '../../../../../policies/dto';
import { MAX_USE_INSTEAD } from '../../../../../policies/schemas/programs';
import { Button } from '../../../components/ui/Button';
import { fieldSentence } from '../../../lib/form-errors';

const SELECT =
  'mt-1 block min-h-10 w-full rounded-md border border-rule-strong bg-sheet px-3 text-sm text-ink ' +
  'aria-[invalid=true]:border-2 aria-[invalid=true]:border-line-deep';

/**
 * "Use instead": up to six library exercises, in order of preference, that the team fitting tries when
 * this exercise is not allowed for an athlete. Added from a list, moved up, removed — buttons, no
 * dragging, so it works the same by keyboard. An exercise archived since it was chosen stays listed
 * (marked) until the coach removes it; the fitting skips it.
 */
export function UseInsteadPicker({
  value,
  onChange,
  library,
  selfId,
  error,
}: {
  value: string[];
  onChange: (ids: string[]) => void;
  library: ExerciseDto[];
  selfId?: string;
  error?: string;
}) {
  const id = useId();
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  const [choice, setChoice] = useState('');
  const byId = new Map(library.map((e) => [e.id, e]));
  const offered = library.filter((e) => e.id !== selfId && !e.archived && !value.includes(e.id));
  const full = value.length >= MAX_USE_INSTEAD;
  const name = (exerciseId: string) => byId.get(exerciseId)?.name ?? 'Unknown exercise';
  const sentence = fieldSentence('Use instead', error);

  const move = (i: number) => onChange(value.map((x, j) => (j === i - 1 ? value[i] : j === i ? value[i - 1] : x)));
  const add = () => {
    if (!choice || full) return;
    onChange([...value, choice]);
    setChoice('');
  };

  return (
    <fieldset className="space-y-2" aria-describedby={sentence ? `${hintId} ${errorId}` : hintId}>
      <legend className="text-sm font-semibold">Use instead</legend>
      <p id={hintId} className="text-sm text-muted">
        When this exercise is not allowed for an athlete, a team session tries these first, in this order. Up to {MAX_USE_INSTEAD}.
      </p>
      {value.length === 0 ? (
        <p className="text-sm text-ink-2">None chosen: only exercises of the same pattern family are tried.</p>
      ) : (
        <ol aria-label="Exercises to use instead, in order" className="space-y-1">
          {value.map((exerciseId, i) => (
            <li key={exerciseId} className="flex flex-wrap items-center gap-2 text-sm">
              <span className="w-5 text-muted tabular-nums">{i + 1}.</span>
              <span className="min-w-0 flex-1 font-semibold">
                {name(exerciseId)}
                {byId.get(exerciseId)?.archived && <span className="font-normal text-muted"> (archived, skipped)</span>}
              </span>
              <Button size="sm" variant="secondary" disabled={i === 0} onClick={() => move(i)} aria-label={`Move ${name(exerciseId)} up`}>
                ↑ Up
              </Button>
              <Button
                size="sm"
                variant="quiet"
                onClick={() => onChange(value.filter((x) => x !== exerciseId))}
                aria-label={`Remove ${name(exerciseId)} from use instead`}
              >
                Remove
              </Button>
            </li>
          ))}
        </ol>
      )}
      <div className="flex flex-wrap items-end gap-2">
        <div className="min-w-[12rem] flex-1">
          <label htmlFor={id} className="block text-sm font-semibold">
            Add an exercise to use instead
          </label>
          <select
            id={id}
            className={SELECT}
            value={choice}
            disabled={full}
            aria-invalid={sentence ? true : undefined}
            onChange={(e) => setChoice(e.target.value)}
          >
            <option value="">{full ? `Already ${MAX_USE_INSTEAD} chosen` : 'Choose an exercise'}</option>
            {offered.map((e) => (
              <option key={e.id} value={e.id}>
                {e.name}
              </option>
            ))}
          </select>
        </div>
        <Button size="md" variant="secondary" disabled={full || !choice} onClick={add}>
          Add
        </Button>
      </div>
      {sentence && (
        <p id={errorId} role="alert" className="flex items-start gap-1.5 text-sm font-semibold text-line-deep">
          <span aria-hidden="true">▲</span>
          <span>{sentence}</span>
        </p>
      )}
    </fieldset>
  );
}
