import { useId } from 'react';
import { Button } from '../../../components/ui/Button';
import { fieldSentence } from '../../../lib/form-errors';

const MAX_LINES = 30;

/**
 * The letter's limits as editable lines, one plain-words limit each. Controlled: pair with
 * react-hook-form's Controller on a string array.
 */
export function LimitLines({
  value,
  onChange,
  onBlur,
  errors,
  listError,
}: {
  value: string[];
  onChange: (next: string[]) => void;
  onBlur?: () => void;
  /** Per line, from the schema (e.g. "is required"). */
  errors?: Array<string | undefined>;
  listError?: string;
}) {
  const id = useId();
  const set = (index: number, text: string) => onChange(value.map((line, i) => (i === index ? text : line)));
  const remove = (index: number) => onChange(value.filter((_, i) => i !== index));

  return (
    <fieldset className="min-w-0" aria-describedby={`${id}-hint`}>
      <legend className="text-sm font-semibold">Limits on the letter</legend>
      <p id={`${id}-hint`} className="text-sm text-muted">
        One limit per line, in the plain words the family will read. Filled in from the plan in force on the From date.
      </p>
      {value.length === 0 ? (
        <p className="mt-2 text-sm text-ink-2">No limits listed. Add each one the athlete must keep to.</p>
      ) : (
        <ol className="mt-2 space-y-2">
          {value.map((line, index) => {
            const label = `Limit ${index + 1}`;
            const message = fieldSentence(label, errors?.[index]);
            return (
              <li key={index} className="flex flex-wrap items-start gap-2">
                <label htmlFor={`${id}-${index}`} className="sr-only">
                  {label}
                </label>
                <span aria-hidden="true" className="mt-2 w-5 shrink-0 text-right text-sm text-muted tabular-nums">
                  {index + 1}.
                </span>
                <div className="min-w-0 flex-1 basis-56">
                  <input
                    id={`${id}-${index}`}
                    value={line}
                    onChange={(e) => set(index, e.target.value)}
                    onBlur={onBlur}
                    aria-invalid={message ? true : undefined}
                    aria-describedby={message ? `${id}-${index}-error` : undefined}
                    className="block min-h-10 w-full rounded-md border border-rule-strong bg-sheet px-3 text-sm aria-[invalid=true]:border-2 aria-[invalid=true]:border-line-deep"
                  />
                  {message && (
                    <p id={`${id}-${index}-error`} className="mt-1 text-sm font-semibold text-line-deep">
                      <span aria-hidden="true">▲ </span>
                      {message}
                    </p>
                  )}
                </div>
                <Button
                  variant="secondary"
                  size="sm"
                  className="mt-1 ml-7 sm:ml-0"
                  aria-label={`Remove limit ${index + 1}`}
                  onClick={() => remove(index)}
                >
                  Remove
                </Button>
              </li>
            );
          })}
        </ol>
      )}
      {listError && (
        <p className="mt-1 text-sm font-semibold text-line-deep">
          <span aria-hidden="true">▲ </span>
          {fieldSentence('The list of limits', listError)}
        </p>
      )}
      {value.length < MAX_LINES && (
        <Button variant="secondary" size="sm" className="mt-2" onClick={() => onChange([...value, ''])}>
          Add a limit
        </Button>
      )}
    </fieldset>
  );
}
