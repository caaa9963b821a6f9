import { useId, useState } from 'react';
import { Controller, useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { LetterUpdateSchema } from '../../../../../policies/schemas';
import type { LetterDto } from '../../../../../policies/dto';
import { isApiError } from '../../../lib/api-client';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { formatDateTime } from '../../../lib/format';
import { Button, buttonClass } from '../../../components/ui/Button';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { getLettersQueryOptions, letterPreviewHref } from '../api/get-letters';
import { useUpdateLetter } from '../api/write-letter';
import { LETTER_FIELDS, LetterFields } from './letter-form-fields';
import { LetterStatusMark } from './LetterMarks';
import { LimitLines } from './LimitLines';
import { SignLetterForm } from './SignLetterForm';
import { DECISION_WORDS, STALE_LETTER } from './letter-words';

type Input = z.input<typeof LetterUpdateSchema>;
type Output = z.output<typeof LetterUpdateSchema>;
type EditableKey = Exclude<keyof Output, 'version'>;

function valuesOf(letter: LetterDto): Input {
  return {
    decision: letter.decision,
    effectiveFrom: letter.effectiveFrom,
    validUntil: letter.validUntil,
    limits: letter.limits,
    credential: letter.credential,
    licenceNumber: letter.licenceNumber,
    familyNote: letter.familyNote,
    version: letter.version,
  };
}

/**
 * A draft is a working document: its fields stay editable (limits as lines) until it is signed.
 * The form keeps the version it was loaded with, so a change made elsewhere is refused, never
 * overwritten or signed unseen.
 */
export function DraftLetter({
  orgId,
  letter,
  signerName,
  replaces,
  onSigned,
}: {
  orgId: string;
  letter: LetterDto;
  signerName: string;
  replaces: LetterDto | null;
  onSigned: (signed: LetterDto) => void;
}) {
  const headingId = useId();
  const queryClient = useQueryClient();
  // The saved draft this form started from; replaced only by our own save or a deliberate reload.
  const [base, setBase] = useState(letter);
  const update = useUpdateLetter(orgId, letter.id);
  const {
    control,
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, dirtyFields, isDirty },
  } = useForm<Input, unknown, Output>({ resolver: zodResolver(LetterUpdateSchema), defaultValues: valuesOf(letter) });
  const decision = useWatch({ control, name: 'decision' });
  const stale = isApiError(update.error) && (update.error.code === 'version_conflict' || update.error.code === 'conflict');

  // Only the changed fields are sent, so the audit trail records just those. A letter turned to Full
  // carries no limits.
  const onSubmit = handleSubmit((values) => {
    const changed: Output = { version: base.version };
    for (const key of LETTER_FIELDS as readonly EditableKey[]) if (dirtyFields[key]) Object.assign(changed, { [key]: values[key] });
    if (values.decision === 'full' && base.limits.length > 0) changed.limits = [];
    update.mutate(changed, {
      onSuccess: (saved) => {
        setBase(saved);
        reset(valuesOf(saved));
      },
      onError: (error) => applyServerFieldErrors(error, setError, LETTER_FIELDS),
    });
  });

  async function loadLatest() {
    const latest = await queryClient
      .fetchQuery({ ...getLettersQueryOptions(orgId, letter.athleteId), staleTime: 0 })
      .then((all) => all.find((l) => l.id === letter.id))
      .catch(() => undefined);
    update.reset();
    if (latest) {
      setBase(latest);
      reset(valuesOf(latest));
    }
  }

  return (
    <article aria-labelledby={headingId} className="rounded-md border border-dashed border-rule-strong bg-paper p-3 sm:p-4">
      <header className="mb-3 flex flex-wrap items-center justify-between gap-2">
        <h3 id={headingId} className="text-base font-bold">
          Draft letter: {DECISION_WORDS[base.decision]}
        </h3>
        <LetterStatusMark status="draft" />
      </header>
      <p className="mb-3 text-sm text-muted">
        Written {formatDateTime(base.createdAt)} by {base.clinicianName}. Not sent to anyone yet.
      </p>

      <form onSubmit={onSubmit} noValidate aria-label="Edit the draft letter" className="space-y-4">
        {stale ? (
          <Notice tone="problem" role="alert" title="Not saved">
            <p>{isApiError(update.error) && update.error.code === 'conflict' ? update.error.message : STALE_LETTER}</p>
            <Button variant="secondary" size="sm" className="mt-2" onClick={() => void loadLatest()}>
              Load the latest draft
            </Button>
          </Notice>
        ) : (
          <ErrorNotice error={update.error} />
        )}
        <LetterFields control={control} register={register} errors={errors} />
        {decision === 'limited' && (
          <Controller
            control={control}
            name="limits"
            render={({ field }) => (
              <LimitLines
                value={field.value ?? []}
                onChange={field.onChange}
                onBlur={field.onBlur}
                errors={Array.isArray(errors.limits) ? errors.limits.map((e) => e?.message) : undefined}
                listError={errors.limits?.message}
              />
            )}
          />
        )}
        <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
          <Button type="submit" variant="secondary" busy={update.isPending} disabled={!isDirty}>
            Save changes to the draft
          </Button>
          {update.isSuccess && !isDirty && (
            <span role="status" className="text-sm text-ink-2">
              Draft saved.
            </span>
          )}
        </div>
      </form>

      <p className="mt-4 text-sm">
        <a href={letterPreviewHref(orgId, letter.id)} download className={buttonClass('secondary', 'sm')}>
          Preview PDF
        </a>{' '}
        <span className="text-muted">— the saved draft, marked DRAFT, with no verification code.</span>
      </p>

      <div className="mt-4 border-t border-rule pt-4">
        <SignLetterForm
          orgId={orgId}
          letterId={letter.id}
          version={base.version}
          signerName={signerName}
          unsaved={isDirty}
          replaces={replaces}
          onSigned={onSigned}
          onStale={() => void loadLatest()}
        />
      </div>
    </article>
  );
}
