import { useId, type ComponentProps, type ReactNode } from 'react';
import { fieldSentence } from '../../lib/form-errors';
import { cx } from './cx';

const CONTROL =
  'block w-full rounded-md border border-rule-strong bg-sheet px-3 text-ink placeholder:text-muted ' +
  'aria-[invalid=true]:border-line-deep aria-[invalid=true]:border-2';

function describedBy(...ids: unknown[]): string | undefined {
  const list = ids.filter((id): id is string => typeof id === 'string' && id !== '').join(' ');
  return list || undefined;
}

function FieldMessage({ id, label, error }: { id: string; label: string; error?: string }) {
  const sentence = fieldSentence(label, error);
  if (!sentence) return null;
  return (
    <p id={id} className="mt-1 flex items-start gap-1.5 text-sm font-semibold text-line-deep">
      <span aria-hidden="true">▲</span>
      <span>{sentence}</span>
    </p>
  );
}

interface FieldFrameProps {
  label: string;
  hint?: ReactNode;
  error?: string;
  /** Large targets for the athlete's and guardian's phone screens. */
  large?: boolean;
}

interface ControlA11y {
  id: string;
  'aria-invalid': true | undefined;
  'aria-describedby': string | undefined;
}

/** Label, hint and error around one control, with the ids that tie them together for screen readers. */
function FieldFrame({
  label,
  hint,
  error,
  className,
  id,
  children,
}: FieldFrameProps & { className?: string; id?: string; children: (a11y: ControlA11y) => ReactNode }) {
  const autoId = useId();
  const controlId = id ?? autoId;
  const hintId = `${controlId}-hint`;
  const errorId = `${controlId}-error`;
  return (
    <div className={className}>
      <label htmlFor={controlId} className="block text-sm font-semibold">
        {label}
      </label>
      {hint && (
        <p id={hintId} className="text-sm text-muted">
          {hint}
        </p>
      )}
      {children({
        id: controlId,
        'aria-invalid': error ? true : undefined,
        'aria-describedby': describedBy(hint && hintId, error && errorId),
      })}
      <FieldMessage id={errorId} label={label} error={error} />
    </div>
  );
}

export type TextFieldProps = ComponentProps<'input'> & FieldFrameProps;

export function TextField({ label, hint, error, large, className, id, ...input }: TextFieldProps) {
  return (
    <FieldFrame label={label} hint={hint} error={error} className={className} id={id}>
      {(a11y) => (
        <input {...a11y} className={cx(CONTROL, 'mt-1', large ? 'min-h-12 text-base' : 'min-h-10 text-sm', 'tabular-nums')} {...input} />
      )}
    </FieldFrame>
  );
}

export type SelectFieldProps = ComponentProps<'select'> & FieldFrameProps;

export function SelectField({ label, hint, error, large, className, id, children, ...select }: SelectFieldProps) {
  return (
    <FieldFrame label={label} hint={hint} error={error} className={className} id={id}>
      {(a11y) => (
        <select {...a11y} className={cx(CONTROL, 'mt-1', large ? 'min-h-12 text-base' : 'min-h-10 text-sm')} {...select}>
          {children}
        </select>
      )}
    </FieldFrame>
  );
}

export type TextAreaFieldProps = ComponentProps<'textarea'> & FieldFrameProps;

/** Free text, e.g. notes. The hint sits between label and box, so who will read it is said up front. */
export function TextAreaField({ label, hint, error, large, className, id, rows = 3, ...textarea }: TextAreaFieldProps) {
  return (
    <FieldFrame label={label} hint={hint} error={error} className={className} id={id}>
      {(a11y) => <textarea {...a11y} rows={rows} className={cx(CONTROL, 'mt-1 py-2', large ? 'text-base' : 'text-sm')} {...textarea} />}
    </FieldFrame>
  );
}

export interface ChoiceOption<V extends string> {
  value: V;
  label: string;
  hint?: string;
}

interface ChoiceGroupBase<V extends string> {
  legend: string;
  options: readonly ChoiceOption<V>[];
  error?: string;
  hint?: ReactNode;
  name: string;
  large?: boolean;
  className?: string;
  disabled?: boolean;
  onBlur?: () => void;
}

type CheckboxGroupProps<V extends string> = ChoiceGroupBase<V> & { value: readonly V[]; onChange: (next: V[]) => void };
type RadioGroupProps<V extends string> = ChoiceGroupBase<V> & { value: V | undefined; onChange: (next: V) => void };

/** Several independent choices (tick boxes, `multiple`) or one choice out of a few (radio buttons). */
export type ChoiceGroupProps<V extends string> = (CheckboxGroupProps<V> & { multiple: true }) | (RadioGroupProps<V> & { multiple?: false });

const CHOICE_ROW = 'flex items-start gap-2 rounded-md py-1.5';
const CHOICE_INPUT = 'mt-0.5 size-5 shrink-0 accent-ink';

/**
 * A fieldset of tick boxes or radio buttons, controlled (pair with react-hook-form's Controller).
 * The legend names the group and the hint describes it. An error marks every input invalid and
 * describes each by the message, so it is read out on whichever input has focus (WCAG 2.2 success
 * criterion 3.3.1 Error Identification, with techniques ARIA21 aria-invalid and ARIA1 aria-describedby).
 */
export function ChoiceGroup<V extends string>(props: ChoiceGroupProps<V>) {
  const { legend, options, error, hint, name, large, className, disabled, onBlur } = props;
  const baseId = useId();
  const hintId = `${baseId}-hint`;
  const errorId = `${baseId}-error`;
  const isChecked = (option: V) => (props.multiple ? props.value.includes(option) : props.value === option);
  function choose(option: V, checked: boolean) {
    if (props.multiple) {
      const current = props.value;
      props.onChange(options.map((o) => o.value).filter((v) => (v === option ? checked : current.includes(v))));
    } else {
      props.onChange(option);
    }
  }
  return (
    <fieldset className={cx('min-w-0', className)} aria-describedby={describedBy(hint && hintId)}>
      <legend className="text-sm font-semibold">{legend}</legend>
      {hint && (
        <p id={hintId} className="text-sm text-muted">
          {hint}
        </p>
      )}
      <div className="mt-1 flex flex-wrap gap-x-5 gap-y-1">
        {options.map((option) => {
          const id = `${baseId}-${option.value}`;
          return (
            <div key={option.value} className={cx(CHOICE_ROW, large && 'min-h-12 items-center')}>
              <input
                id={id}
                type={props.multiple ? 'checkbox' : 'radio'}
                name={name}
                value={option.value}
                checked={isChecked(option.value)}
                onChange={(e) => choose(option.value, e.target.checked)}
                onBlur={onBlur}
                disabled={disabled}
                aria-invalid={error ? true : undefined}
                aria-describedby={describedBy(error && errorId)}
                className={CHOICE_INPUT}
              />
              <label htmlFor={id} className="text-sm">
                {option.label}
                {option.hint && <span className="block text-muted">{option.hint}</span>}
              </label>
            </div>
          );
        })}
      </div>
      <FieldMessage id={errorId} label={legend} error={error} />
    </fieldset>
  );
}

/** Several independent choices, e.g. a person's roles. */
export function CheckboxGroup<V extends string>(props: CheckboxGroupProps<V>) {
  return <ChoiceGroup {...props} multiple />;
}

/** One choice out of a few, e.g. kg or lb. */
export function RadioGroup<V extends string>(props: RadioGroupProps<V>) {
  return <ChoiceGroup {...props} multiple={false} />;
}
