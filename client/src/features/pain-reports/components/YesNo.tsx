import { useId, type ReactNode } from 'react';
import { cx } from '../../../components/ui/cx';

/**
 * One yes-or-no question with no answer chosen at the start, so "not answered" never passes for
 * "no". Two large halves of one row; native radios underneath.
 */
export function YesNo({
  question,
  value,
  onChange,
  onBlur,
  error,
  hint,
  groupRef,
}: {
  question: ReactNode;
  value: boolean | undefined;
  onChange: (next: boolean) => void;
  onBlur?: () => void;
  /** A full sentence shown under the question, e.g. "Answer Yes or No." */
  error?: string;
  hint?: ReactNode;
  /** Lets the form move focus here when this question is still unanswered. */
  groupRef?: (el: HTMLDivElement | null) => void;
}) {
  const id = useId();
  const options = [
    { label: 'Yes', v: true },
    { label: 'No', v: false },
  ] as const;
  return (
    <div
      ref={groupRef}
      role="radiogroup"
      aria-labelledby={`${id}-q`}
      aria-describedby={[hint ? `${id}-hint` : '', error ? `${id}-error` : ''].join(' ').trim() || undefined}
      aria-invalid={error ? true : undefined}
      tabIndex={-1}
      className="min-w-0 rounded-md focus:outline-none"
    >
      <p id={`${id}-q`} className="text-base font-semibold">
        {question}
      </p>
      {hint && (
        <p id={`${id}-hint`} className="text-sm text-muted">
          {hint}
        </p>
      )}
      <div className="mt-2 grid max-w-sm grid-cols-2 gap-2">
        {options.map((o) => (
          <label key={o.label} className="block">
            <input type="radio" name={id} checked={value === o.v} onChange={() => onChange(o.v)} onBlur={onBlur} className="peer sr-only" />
            <span
              className={cx(
                'flex min-h-12 cursor-pointer items-center justify-center rounded-md border text-base font-semibold',
                'peer-focus-visible:outline-3 peer-focus-visible:outline-offset-2 peer-focus-visible:outline-line',
                // Chosen is decided here, not by `peer-checked:` beside `hover:`: the hover fill won and left
                // light text on a light fill (about 1.1:1, under WCAG 2.1 success criterion 1.4.3's 4.5:1).
                value === o.v
                  ? 'border-ink bg-ink text-paper'
                  : cx('bg-sheet text-ink hover:bg-shade', error ? 'border-2 border-line-deep' : 'border-rule-strong'),
              )}
            >
              {o.label}
            </span>
          </label>
        ))}
      </div>
      {error && (
        <p id={`${id}-error`} className="mt-1 flex items-start gap-1.5 text-sm font-semibold text-line-deep">
          <span aria-hidden="true">▲</span>
          <span>{error}</span>
        </p>
      )}
    </div>
  );
}
