import { useId, type ComponentProps } from 'react';
import { fieldSentence } from '../../../lib/form-errors';
import { cx } from '../../../components/ui/cx';
import { EFFORT_SCORES, EFFORT_WORDS, effortWords } from './effort-words';

export const EFFORT_LABEL = 'Session effort (0–10)';

/**
 * Session RPE: a number box, with a button for every score 0–10 (Foster's words on the scores that
 * have them) that fills the box — a tap is enough, and typing works too. `input` is react-hook-form's register() result.
 */
export function SessionEffortField({
  value,
  onPick,
  error,
  input,
}: {
  value: unknown;
  onPick: (score: number) => void;
  error?: string;
  input: ComponentProps<'input'>;
}) {
  const id = useId();
  const message = fieldSentence('Session effort', error);
  const current = typeof value === 'number' && Number.isInteger(value) && value >= 0 && value <= 10 ? value : null;
  return (
    <div>
      <label htmlFor={id} className="block text-base font-semibold">
        {EFFORT_LABEL}
      </label>
      <p id={`${id}-hint`} className="text-sm text-muted">
        How hard was the whole session? Think of it about half an hour after you finish.
      </p>
      <div className="mt-1 flex items-center gap-3">
        <input
          id={id}
          type="number"
          inputMode="numeric"
          min={0}
          max={10}
          step={1}
          aria-invalid={message ? true : undefined}
          aria-describedby={[`${id}-hint`, `${id}-words`, message ? `${id}-error` : ''].join(' ').trim()}
          className={cx(
            'block min-h-12 w-24 rounded-md border bg-sheet px-3 text-lg tabular-nums',
            message ? 'border-2 border-line-deep' : 'border-rule-strong',
          )}
          {...input}
        />
        <p id={`${id}-words`} aria-live="polite" className="text-base font-semibold">
          {current !== null ? effortWords(current) : ''}
        </p>
      </div>
      {message && (
        <p id={`${id}-error`} className="mt-1 flex items-start gap-1.5 text-sm font-semibold text-line-deep">
          <span aria-hidden="true">▲</span>
          <span>{message}</span>
        </p>
      )}
      <ul aria-label="Effort scale" className="mt-2 grid grid-cols-2 gap-1.5 sm:grid-cols-4">
        {EFFORT_SCORES.map((s) => (
          <li key={s}>
            <button
              type="button"
              onClick={() => onPick(s)}
              aria-pressed={current === s}
              className={cx(
                'flex min-h-11 w-full items-center gap-2 rounded-md border px-3 text-left text-sm',
                current === s ? 'border-ink bg-ink text-paper' : 'border-rule-strong bg-sheet hover:bg-shade',
              )}
            >
              <span className="w-5 font-bold tabular-nums">{s}</span>
              {/* The scale has no words at 6, 8 and 9 (Foster et al. 2001); the button still gives the number. */}
              <span className={EFFORT_WORDS[s] ? undefined : 'text-muted'}>{EFFORT_WORDS[s] ?? ''}</span>
            </button>
          </li>
        ))}
      </ul>
    </div>
  );
}
