import type { Control, FieldErrors, UseFormRegister } from 'react-hook-form';
import { Controller } from 'react-hook-form';
import { emptyToNull } from '../../../lib/form-values';
import { RadioGroup, TextAreaField, TextField } from '../../../components/ui/Field';
import { DECISION_WORDS } from './letter-words';

/** What the create and edit forms share; each form's own values carry at least these keys. */
export interface LetterFieldValues {
  decision?: 'full' | 'limited';
  effectiveFrom?: string;
  validUntil?: string | null;
  credential?: string;
  licenceNumber?: string;
  familyNote?: string;
}

const DECISIONS = (['full', 'limited'] as const).map((value) => ({ value, label: DECISION_WORDS[value] }));

export const LETTER_FIELDS = ['decision', 'effectiveFrom', 'validUntil', 'limits', 'credential', 'licenceNumber', 'familyNote'] as const;

/** Decision, dates, the signer's credential and the note: the same fields when writing and editing a draft. */
export function LetterFields<T extends LetterFieldValues>({
  control,
  register,
  errors,
}: {
  control: Control<T>;
  register: UseFormRegister<T>;
  errors: FieldErrors<LetterFieldValues>;
}) {
  // The generic form type is narrowed to the shared keys; both forms hold them under these names.
  const c = control as unknown as Control<LetterFieldValues>;
  const r = register as unknown as UseFormRegister<LetterFieldValues>;
  return (
    <>
      <Controller
        control={c}
        name="decision"
        render={({ field }) => (
          <RadioGroup
            legend="Decision"
            hint="Full: cleared without limits. Limited: cleared within the limits listed on the letter."
            name={field.name}
            options={DECISIONS}
            value={field.value}
            onChange={field.onChange}
            onBlur={field.onBlur}
            error={errors.decision?.message}
          />
        )}
      />
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField label="From" type="date" error={errors.effectiveFrom?.message} {...r('effectiveFrom')} />
        <TextField
          label="Valid until (next review)"
          type="date"
          hint="Leave empty when there is no end date."
          error={errors.validUntil?.message}
          {...r('validUntil', { setValueAs: emptyToNull })}
        />
        <TextField
          label="Credential"
          hint="As printed after your name, e.g. “PT” or “ATC”. Leave out what your name already shows."
          autoComplete="off"
          error={errors.credential?.message}
          {...r('credential')}
        />
        <TextField label="Licence number" autoComplete="off" error={errors.licenceNumber?.message} {...r('licenceNumber')} />
      </div>
      <TextAreaField
        label="Note for the family"
        hint="Optional. Printed on the letter in your words, e.g. “Build back to full games over two weeks.”"
        rows={3}
        error={errors.familyNote?.message}
        {...r('familyNote')}
      />
    </>
  );
}
