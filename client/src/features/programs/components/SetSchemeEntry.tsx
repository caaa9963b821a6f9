import { useId, useRef, useState, type KeyboardEvent } from 'react';
import { parseSetScheme, type SchemeSet } from '../../../../../policies/load/set-scheme';
import { Button } from '../../../components/ui/Button';

const CONTROL =
  'block min-h-10 w-full rounded-md border border-rule-strong bg-sheet px-3 text-sm text-ink tabular-nums ' +
  'placeholder:text-muted aria-[invalid=true]:border-2 aria-[invalid=true]:border-line-deep';

/**
 * Quick entry of an exercise's sets: the coach types "3 x 5 @ 75 %" or "4 x 8 @ RPE 7" and presses
 * Enter or "Use"; the parsed sets replace the exercise's sets (grammar: policies/load/set-scheme.ts).
 * Bad input leaves the sets alone and says what was expected and at which character, with the cursor
 * put there. It is not a form of its own (it sits inside the session editor's form), so Enter is
 * caught here and never submits the session.
 */
export function SetSchemeEntry({ exerciseName, onUse }: { exerciseName: string; onUse: (sets: SchemeSet[]) => void }) {
  const id = useId();
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  const input = useRef<HTMLInputElement>(null);
  const [text, setText] = useState('');
  const [error, setError] = useState<{ at: number; message: string; text: string } | null>(null);
  const [done, setDone] = useState<string | null>(null);

  function apply() {
    const result = parseSetScheme(text);
    if (!result.ok) {
      setDone(null);
      setError({ at: result.at, message: result.message, text });
      const el = input.current;
      if (el) {
        el.focus();
        el.setSelectionRange(result.at, result.at);
      }
      return;
    }
    setError(null);
    onUse(result.sets);
    setDone(`${exerciseName} now has ${result.sets.length} ${result.sets.length === 1 ? 'set' : 'sets'}.`);
    setText('');
  }

  function onKeyDown(e: KeyboardEvent<HTMLInputElement>) {
    if (e.key !== 'Enter') return;
    e.preventDefault();
    apply();
  }

  return (
    <div className="min-w-[14rem] flex-1">
      <label htmlFor={id} className="block text-sm font-semibold">
        Sets (quick entry)
      </label>
      <p id={hintId} className="text-sm text-muted">
        Replaces the sets of {exerciseName}. For example <kbd className="font-mono">3 x 5 @ 75 %</kbd> or{' '}
        <kbd className="font-mono">4 x 8 @ RPE 7</kbd>.
      </p>
      <div className="mt-1 flex gap-2">
        <input
          ref={input}
          id={id}
          type="text"
          autoComplete="off"
          spellCheck={false}
          className={CONTROL}
          value={text}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${hintId} ${errorId}` : hintId}
          onChange={(e) => {
            setText(e.target.value);
            setDone(null);
          }}
          onKeyDown={onKeyDown}
        />
        <Button size="md" variant="secondary" onClick={apply} aria-label={`Use these sets for ${exerciseName}`}>
          Use
        </Button>
      </div>
      {error && (
        <div id={errorId} role="alert" className="mt-1 text-sm font-semibold text-line-deep">
          <p className="flex items-start gap-1.5">
            <span aria-hidden="true">▲</span>
            <span>
              Not used: at character {error.at + 1}, {error.message}.
            </span>
          </p>
          <pre aria-hidden="true" className="mt-0.5 overflow-x-auto font-mono text-xs leading-tight text-ink-2">
            {error.text}
            {'\n'}
            {' '.repeat(error.at)}^
          </pre>
        </div>
      )}
      <p role="status" className="mt-1 text-sm text-ink-2">
        {done}
      </p>
    </div>
  );
}
