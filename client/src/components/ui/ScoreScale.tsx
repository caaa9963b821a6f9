import { useId, type ReactNode } from 'react';
import { fieldSentence } from '../../lib/form-errors';
import { cx } from './cx';

const SCORES = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10] as const;

/** The mark of "past the ceiling": a hatched band, kept off the number so the number always sits on a solid fill. */
const HATCH = 'bg-[repeating-linear-gradient(135deg,var(--color-rule-strong)_0_2px,var(--color-sheet)_2px_5px)]';

/**
 * Fill and text of one score. Chosen is decided here, not by stacked `peer-checked:` and `hover:`
 * classes, because a hover fill declared later in the style sheet used to win over the chosen fill
 * (light text on a light fill, about 1.1:1). Every text/fill pair here is at least 4.5:1 (WCAG 2.1
 * success criterion 1.4.3): paper on ink 14.9:1, paper on line-deep 6.0:1, ink on shade 13.3:1, ink on sheet 16.2:1.
 */
function scoreLook(chosen: boolean, over: boolean, invalid: boolean): string {
  if (chosen) return over ? 'border-line-deep bg-line-deep text-paper' : 'border-ink bg-ink text-paper';
  return cx('bg-sheet text-ink hover:bg-shade', invalid ? 'border-line-deep border-2' : 'border-rule-strong');
}

export interface ScoreScaleProps {
  /** Names the group; each choice is named "<label> <n>", e.g. "Pain now 3". */
  label: string;
  value: number | undefined | null;
  onChange: (next: number) => void;
  onBlur?: () => void;
  /** The words under the two ends, e.g. "No pain" and "Worst pain you can imagine". */
  low: string;
  high: string;
  hint?: ReactNode;
  error?: string;
  /** Marks a limit on the row (e.g. the clinician's pain ceiling): scores past it carry a hatched band. */
  limit?: number;
  className?: string;
}

/**
 * A 0–10 score as one row of large choices (two rows on a phone), for the athlete's screens.
 * Native radios underneath: arrow keys move between scores and the chosen one is announced.
 */
export function ScoreScale({ label, value, onChange, onBlur, low, high, hint, error, limit, className }: ScoreScaleProps) {
  const id = useId();
  const labelId = `${id}-label`;
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  const message = fieldSentence(label, error);
  const described = [hint ? hintId : null, `${id}-ends`, message ? errorId : null].filter(Boolean).join(' ');

  return (
    <div
      role="radiogroup"
      aria-labelledby={labelId}
      aria-describedby={described}
      aria-invalid={message ? true : undefined}
      className={cx('min-w-0', className)}
    >
      <p id={labelId} className="text-base font-semibold">
        {label}
      </p>
      {hint && (
        <p id={hintId} className="text-sm text-muted">
          {hint}
        </p>
      )}
      <div className="mt-2 grid grid-cols-6 gap-1.5 sm:grid-cols-11">
        {SCORES.map((n) => {
          const over = limit !== undefined && n > limit;
          const chosen = value === n;
          return (
            <label key={n} className="relative block">
              <input
                type="radio"
                name={id}
                value={n}
                checked={chosen}
                onChange={() => onChange(n)}
                onBlur={onBlur}
                aria-label={`${label} ${n}`}
                className="peer sr-only"
              />
              <span
                aria-hidden="true"
                data-score={n}
                className={cx(
                  'relative flex min-h-12 cursor-pointer items-center justify-center overflow-hidden rounded-md border text-lg font-semibold tabular-nums',
                  'peer-focus-visible:outline-3 peer-focus-visible:outline-offset-2 peer-focus-visible:outline-line',
                  scoreLook(chosen, over, Boolean(message)),
                )}
              >
                {n}
                {over && (
                  <span className={cx('absolute inset-x-0 bottom-0 h-2 border-t', HATCH, chosen ? 'border-paper' : 'border-rule-strong')} />
                )}
              </span>
            </label>
          );
        })}
      </div>
      <p id={`${id}-ends`} className="mt-1 flex justify-between gap-4 text-sm text-muted">
        <span>0 {low.toLowerCase()}</span>
        <span className="text-right">10 {high.toLowerCase()}</span>
      </p>
      {limit !== undefined && (
        <p className="text-sm text-ink-2">
          <span aria-hidden="true" className={cx('mr-1 inline-block h-3 w-4 border border-rule-strong align-middle', HATCH)} />
          Past your clinician&apos;s ceiling of {limit}/10.
        </p>
      )}
      {message && (
        <p id={errorId} className="mt-1 flex items-start gap-1.5 text-sm font-semibold text-line-deep">
          <span aria-hidden="true">▲</span>
          <span>{message}</span>
        </p>
      )}
    </div>
  );
}
