import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { LetterCreateSchema } from '../../../../../policies/schemas';
import type { LetterDto } from '../../../../../policies/dto';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { todayLocal } from '../../../lib/dates';
import { Button } from '../../../components/ui/Button';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { useCreateLetter } from '../api/write-letter';
import { LETTER_FIELDS, LetterFields } from './letter-form-fields';

type Input = z.input<typeof LetterCreateSchema>;
type Output = z.output<typeof LetterCreateSchema>;

/**
 * A new draft. For a limited decision the limits are left out, so the server fills in the limits in
 * force on the start date in plain words; the clinician edits them on the draft afterwards.
 */
export function WriteLetterForm({
  orgId,
  athleteId,
  athleteName,
  signer,
  onSaved,
  onCancel,
}: {
  orgId: string;
  athleteId: string;
  athleteName: string;
  /** The clinician's credential and licence from their last letter, so they need not type them again. */
  signer: { credential: string; licenceNumber: string };
  onSaved: (draft: LetterDto) => void;
  onCancel: () => void;
}) {
  const create = useCreateLetter(orgId);
  const {
    control,
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<Input, unknown, Output>({
    resolver: zodResolver(LetterCreateSchema),
    defaultValues: { athleteId, effectiveFrom: todayLocal(), validUntil: null, familyNote: '', ...signer },
  });
  const decision = useWatch({ control, name: 'decision' });

  const onSubmit = handleSubmit((values) =>
    create.mutate(values, {
      onSuccess: onSaved,
      onError: (error) => applyServerFieldErrors(error, setError, LETTER_FIELDS),
    }),
  );

  return (
    <form onSubmit={onSubmit} noValidate aria-label={`Write a clearance letter for ${athleteName}`} className="space-y-4">
      <ErrorNotice error={create.error} />
      <LetterFields control={control} register={register} errors={errors} />
      {decision === 'limited' && (
        <Notice tone="info">
          <p>
            When you save, the limits in force on the From date are filled in, in plain words. You can edit them line by line before you
            sign.
          </p>
        </Notice>
      )}
      <p className="text-sm text-ink-2">Saving keeps a draft: nothing is sent until you sign it.</p>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={create.isPending}>
          Save draft letter
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
