import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { LetterCreateSchema } from '../../../../../policies/schemas';
import type { LetterDto, LetterPrefillDto } from '../../../../../policies/dto';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { todayLocal } from '../../../lib/dates';
import { Button } from '../../../components/ui/Button';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { useCreateLetter } from '../api/write-letter';
import { LETTER_FIELDS, LetterFields } from './letter-form-fields';
import { LimitsList } from './LetterRecord';

type Input = z.input<typeof LetterCreateSchema>;
type Output = z.output<typeof LetterCreateSchema>;

/**
 * A new draft. For a limited decision the limits are left out, so the server fills in the limits in
 * force on the start date in plain words; the clinician edits them on the draft afterwards. The updated
 * letter comes `prefill`ed from what is in force today (decision, dates, credential), with the limit
 * lines it will list shown beforehand.
 */
export function WriteLetterForm({
  orgId,
  athleteId,
  athleteName,
  signer,
  onSaved,
  onCancel,
  prefill,
}: {
  orgId: string;
  athleteId: string;
  athleteName: string;
  /** The clinician's credential and licence from their last letter, so they need not type them again. */
  signer: { credential: string; licenceNumber: string };
  onSaved: (draft: LetterDto) => void;
  onCancel: () => void;
  prefill?: LetterPrefillDto;
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
    defaultValues: prefill
      ? {
          athleteId,
          effectiveFrom: prefill.effectiveFrom,
          validUntil: prefill.validUntil,
          familyNote: '',
          ...(prefill.decision ? { decision: prefill.decision } : {}),
          credential: prefill.credential || signer.credential,
          licenceNumber: prefill.licenceNumber || signer.licenceNumber,
        }
      : { athleteId, effectiveFrom: todayLocal(), validUntil: null, familyNote: '', ...signer },
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
      {prefill && (
        <Notice tone="info" title="Filled in from what is in force today">
          {prefill.status === 'out' ? (
            <p>
              {athleteName} is Out today. A clearance letter clears for full or limited participation: choose the decision once it applies.
            </p>
          ) : (
            <p>
              {athleteName} is {prefill.status === 'full' ? 'Full' : 'Limited'} today.{' '}
              {prefill.limits.length ? 'The letter will list these limits:' : 'No limit is in force.'}
            </p>
          )}
          {prefill.limits.length > 0 && <LimitsList limits={prefill.limits} />}
        </Notice>
      )}
      <LetterFields control={control} register={register} errors={errors} />
      {decision === 'limited' && !prefill && (
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
