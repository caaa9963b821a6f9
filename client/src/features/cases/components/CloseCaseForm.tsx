import { useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { CaseCloseSchema } from '../../../../../policies/schemas';
import type { CaseDetailDto } from '../../../../../policies/dto';
import { isApiError } from '../../../lib/api-client';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { emptyToUndefined } from '../../../lib/form-values';
import { todayLocal } from '../../../lib/dates';
import { queryKeys } from '../../../lib/query-keys';
import { Button } from '../../../components/ui/Button';
import { TextAreaField, TextField } from '../../../components/ui/Field';
import { ErrorNotice } from '../../../components/ui/Notice';
import { useCloseCase } from '../api/close-case';
import { STALE_CASE } from './case-words';

type Input = z.input<typeof CaseCloseSchema>;
type Output = z.output<typeof CaseCloseSchema>;

/** Closing is final for this episode, so it takes a deliberate second step. */
export function CloseCaseForm({ orgId, detail }: { orgId: string; detail: CaseDetailDto }) {
  const [open, setOpen] = useState(false);
  const queryClient = useQueryClient();
  const close = useCloseCase(orgId, detail.id);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<Input, unknown, Output>({
    resolver: zodResolver(CaseCloseSchema),
    defaultValues: { closedOn: todayLocal(), version: detail.version },
  });

  if (!open) {
    return (
      <div className="space-y-2 text-sm">
        <p className="text-ink-2">
          Close the case when this episode is resolved. Its plan stops being in force from then on, and the case can no longer change; a new
          problem gets a new case.
        </p>
        <Button variant="danger" size="sm" onClick={() => setOpen(true)}>
          Close this case…
        </Button>
      </div>
    );
  }

  // Sent with the version of the case on screen; after a clash the page reloads it for a fresh look.
  const onSubmit = handleSubmit((values) =>
    close.mutate(
      { ...values, version: detail.version },
      {
        onError: (error) => {
          if (isApiError(error) && error.code === 'version_conflict') {
            void queryClient.invalidateQueries({ queryKey: queryKeys.case(orgId, detail.id) });
          }
          applyServerFieldErrors(error, setError, ['closedOn', 'closingNote']);
        },
      },
    ),
  );

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Close the case" className="space-y-3">
      <ErrorNotice error={close.error} wording={{ versionConflict: STALE_CASE }} />
      {isApiError(close.error) && close.error.code === 'version_conflict' && (
        <p className="text-sm text-ink-2">The page now shows the latest case; check it before closing.</p>
      )}
      <TextField label="Closed on" type="date" className="sm:w-48" error={errors.closedOn?.message} {...register('closedOn')} />
      <TextAreaField
        label="Closing note"
        hint="Seen by the athlete, their family and the coach."
        rows={2}
        error={errors.closingNote?.message}
        {...register('closingNote', { setValueAs: emptyToUndefined })}
      />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="danger" busy={close.isPending}>
          Close case
        </Button>
        <Button variant="secondary" onClick={() => setOpen(false)}>
          Keep it open
        </Button>
      </div>
    </form>
  );
}
