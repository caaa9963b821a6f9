import { Controller, type Control, type FieldPath, type FieldValues } from 'react-hook-form';
import { useId, type ReactNode } from 'react';
import { fieldSentence } from '../../lib/form-errors';
import { cx } from './cx';

const SCORES = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10] as const;

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
  /** Marks a limit on the row (e.g. the clinician's pain ceiling): scores past it are hatched. */
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
          return (
            <label key={n} className="relative block">
              <input
                type="radio"
                name={id}
                value={n}
                checked={value === n}
                onChange={() => onChange(n)}
                onBlur={onBlur}
                aria-label={`${label} ${n}`}
                className="peer sr-only"
              />
              <span
                aria-hidden="true"
                className={cx(
                  'flex min-h-12 cursor-pointer items-center justify-center rounded-md border text-lg font-semibold tabular-nums',
                  'peer-checked:border-ink peer-checked:bg-ink peer-checked:text-paper',
                  'peer-focus-visible:outline-3 peer-focus-visible:outline-offset-2 peer-focus-visible:outline-line',
                  message ? 'border-line-deep border-2' : 'border-rule-strong',
                  over
                    ? 'bg-[repeating-linear-gradient(135deg,var(--color-shade)_0_4px,var(--color-sheet)_4px_8px)]'
                    : 'bg-sheet hover:bg-shade',
                )}
              >
                {n}
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
          <span
            aria-hidden="true"
            className="mr-1 inline-block h-3 w-4 border border-rule-strong bg-[repeating-linear-gradient(135deg,var(--color-shade)_0_3px,var(--color-sheet)_3px_6px)] align-middle"
          />
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

/** A ScoreScale bound to a react-hook-form field. */
export function ScoreField<T extends FieldValues>({
  control,
  name,
  ...scale
}: Omit<ScoreScaleProps, 'value' | 'onChange' | 'onBlur'> & { control: Control<T, any, any>; name: FieldPath<T> }) {
  return (
    <Controller
      control={control}
      name={name}
      render={({ field }) => <ScoreScale {...scale} value={field.value} onChange={field.onChange} onBlur={field.onBlur} />}
    />
  );
}
