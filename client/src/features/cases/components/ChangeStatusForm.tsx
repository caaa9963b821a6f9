import { Controller, useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { StatusChangeSchema } from '../../../../../policies/schemas';
import type { CaseDetailDto } from '../../../../../policies/dto';
import { PARTICIPATION_STATUSES, STATUS_LABELS } from '../../../../../policies/load/patterns';
import { isApiError } from '../../../lib/api-client';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { emptyToUndefined } from '../../../lib/form-values';
import { todayLocal } from '../../../lib/dates';
import { Button } from '../../../components/ui/Button';
import { RadioGroup, TextAreaField, TextField } from '../../../components/ui/Field';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { getCaseQueryOptions } from '../api/get-case';
import { useChangeStatus } from '../api/change-status';
import { STALE_CASE } from './case-words';
import { STATUS_HINTS } from './OpenCaseForm';

type Input = z.input<typeof StatusChangeSchema>;
type Output = z.output<typeof StatusChangeSchema>;

const OPTIONS = PARTICIPATION_STATUSES.map((s) => ({ value: s, label: STATUS_LABELS[s], hint: STATUS_HINTS[s] }));

/** Out → Limited → Full (or back), from a date, with a plain-words note. Guarded by the case version. */
export function ChangeStatusForm({ orgId, detail }: { orgId: string; detail: CaseDetailDto }) {
  const queryClient = useQueryClient();
  const change = useChangeStatus(orgId, detail.id);
  const {
    control,
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors },
  } = useForm<Input, unknown, Output>({
    resolver: zodResolver(StatusChangeSchema),
    defaultValues: { effectiveFrom: todayLocal(), version: detail.version },
  });

  const stale = isApiError(change.error) && change.error.code === 'version_conflict';

  // The version sent is the one of the case on screen: the history shown is what the clinician saw.
  const onSubmit = handleSubmit((values) =>
    change.mutate(
      { ...values, version: detail.version },
      {
        onSuccess: (saved) => reset({ effectiveFrom: todayLocal(), version: saved.version, note: undefined, status: undefined }),
        onError: (error) => applyServerFieldErrors(error, setError, ['status', 'effectiveFrom', 'note']),
      },
    ),
  );

  async function loadLatest() {
    const latest = await queryClient.fetchQuery({ ...getCaseQueryOptions(orgId, detail.id), staleTime: 0 }).catch(() => null);
    change.reset();
    if (latest) reset({ effectiveFrom: todayLocal(), version: latest.version });
  }

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Change status" className="space-y-3">
      {stale ? (
        <Notice tone="problem" role="alert" title="Status not changed">
          <p>{STALE_CASE}</p>
          <Button variant="secondary" size="sm" className="mt-2" onClick={() => void loadLatest()}>
            Load the latest case
          </Button>
        </Notice>
      ) : (
        <ErrorNotice error={change.error} />
      )}
      {change.isSuccess && (
        <Notice tone="done" role="status">
          <p>Status saved. The athlete, their family and the coach see it from its date.</p>
        </Notice>
      )}
      <Controller
        control={control}
        name="status"
        render={({ field }) => (
          <RadioGroup
            legend="New status"
            name={field.name}
            options={OPTIONS}
            value={field.value}
            onChange={field.onChange}
            onBlur={field.onBlur}
            error={errors.status?.message}
          />
        )}
      />
      <TextField
        label="Effective from"
        type="date"
        className="sm:w-48"
        error={errors.effectiveFrom?.message}
        {...register('effectiveFrom')}
      />
      <TextAreaField
        label="Note for the athlete and family"
        hint="Plain words, e.g. “Back to team practice; no sliding yet.”"
        rows={2}
        error={errors.note?.message}
        {...register('note', { setValueAs: emptyToUndefined })}
      />
      <Button type="submit" busy={change.isPending}>
        Change status
      </Button>
    </form>
  );
}
