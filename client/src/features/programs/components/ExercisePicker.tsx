import { useId, useState } from 'react';
import type { ExerciseDto } from '../../../../../policies/dto';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { patternWords } from './program-words';

const SHOWN = 8;

/**
 * Adds an exercise from the library by search (name or pattern). Each result says, before it is
 * picked, whether a limit on the session's date rules it out.
 */
export function ExercisePicker({
  library,
  onPick,
  ruledOut,
  disabled,
}: {
  library: ExerciseDto[];
  onPick: (exerciseId: string) => void;
  /** Why an exercise cannot be programmed on the session's date, if it cannot. */
  ruledOut: (exercise: ExerciseDto) => string | null;
  disabled?: boolean;
}) {
  const [open, setOpen] = useState(false);
  const [query, setQuery] = useState('');
  const resultsId = useId();
  const q = query.trim().toLowerCase();
  const matches = library
    .filter((e) => !e.archived)
    .filter((e) => q === '' || e.name.toLowerCase().includes(q) || patternWords(e).toLowerCase().includes(q));

  function pick(exerciseId: string) {
    onPick(exerciseId);
    setQuery('');
    setOpen(false);
  }

  if (!open) {
    return (
      <Button variant="secondary" onClick={() => setOpen(true)} disabled={disabled}>
        Add exercise
      </Button>
    );
  }
  return (
    <div className="rounded-lg border border-rule-strong bg-sheet p-3">
      <div className="flex flex-wrap items-end gap-2">
        <TextField
          label="Find an exercise"
          type="search"
          autoFocus
          className="min-w-[12rem] flex-1"
          value={query}
          onChange={(e) => setQuery(e.target.value)}
          onKeyDown={(e) => {
            // Enter takes the first match rather than submitting the session around it.
            if (e.key !== 'Enter') return;
            e.preventDefault();
            if (matches[0]) pick(matches[0].id);
          }}
          aria-controls={resultsId}
          placeholder="Name or pattern, e.g. hinge"
        />
        <Button variant="quiet" onClick={() => setOpen(false)}>
          Close
        </Button>
      </div>
      <ul id={resultsId} aria-label="Matching exercises" className="mt-2 divide-y divide-rule">
        {matches.slice(0, SHOWN).map((e) => {
          const why = ruledOut(e);
          const hintId = `${resultsId}-${e.id}`;
          return (
            <li key={e.id} className="flex flex-wrap items-center justify-between gap-2 py-1.5">
              <span id={hintId} className="text-xs text-muted">
                {patternWords(e)}
                {e.ballistic && ' · impact'}
                {why && <span className="font-semibold text-line-deep"> · {why}</span>}
              </span>
              <Button size="sm" variant="secondary" className="order-first" aria-describedby={hintId} onClick={() => pick(e.id)}>
                {e.name}
              </Button>
            </li>
          );
        })}
      </ul>
      <p className="mt-1 text-xs text-muted" aria-live="polite">
        {matches.length === 0
          ? 'Nothing in the library matches. Add it on the exercise library page.'
          : matches.length > SHOWN
            ? `Showing ${SHOWN} of ${matches.length}: type more to narrow.`
            : `${matches.length} match${matches.length === 1 ? '' : 'es'}.`}
      </p>
    </div>
  );
}
