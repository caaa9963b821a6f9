import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { CaseUpdateSchema } from '../../../../../policies/schemas';
import type { CaseDetailDto } from '../../../../../policies/dto';
import { isApiError } from '../../../lib/api-client';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { emptyToNull } from '../../../lib/form-values';
import { formatDate, formatDateTime } from '../../../lib/format';
import { Button } from '../../../components/ui/Button';
import { TextAreaField, TextField } from '../../../components/ui/Field';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Facts } from '../../../components/ui/Panel';
import { getCaseQueryOptions } from '../api/get-case';
import { useUpdateCase } from '../api/update-case';
import { BodyRegionPicker } from './BodyRegionPicker';
import { STALE_CASE, regionsText } from './case-words';

type Input = z.input<typeof CaseUpdateSchema>;
type Output = z.output<typeof CaseUpdateSchema>;
type EditableKey = Exclude<keyof Output, 'version'>;
const EDITABLE: EditableKey[] = ['bodyRegions', 'onsetDate', 'diagnosis', 'clinicalNotes', 'reviewDate'];

/** The case's facts; a clinician who may edit gets an edit form guarded by the case version. */
export function CaseDetails({ orgId, detail, canEdit }: { orgId: string; detail: CaseDetailDto; canEdit: boolean }) {
  const [editing, setEditing] = useState(false);
  const clinical = 'clinicalNotes' in detail;

  if (editing) return <EditCaseForm orgId={orgId} detail={detail} onDone={() => setEditing(false)} />;

  return (
    <div className="space-y-3">
      <Facts
        items={[
          { label: 'Body regions', value: regionsText(detail.bodyRegions) },
          { label: 'Onset', value: formatDate(detail.onsetDate) },
          ...(clinical || 'diagnosis' in detail
            ? [{ label: 'Working diagnosis', value: detail.diagnosis || <span className="text-muted">none written</span> }]
            : []),
          { label: 'Review date', value: detail.reviewDate ? formatDate(detail.reviewDate) : <span className="text-muted">none set</span> },
          {
            label: 'Opened',
            value: `${formatDateTime(detail.openedAt)}${detail.openedByName ? ` by ${detail.openedByName}` : ''}`,
          },
        ]}
      />
      {clinical && (
        <div>
          <p className="text-sm text-muted">Clinical notes (clinicians only)</p>
          {detail.clinicalNotes ? (
            <p className="mt-1 rounded-md bg-paper p-3 text-sm whitespace-pre-wrap">{detail.clinicalNotes}</p>
          ) : (
            <p className="mt-1 text-sm text-muted">none written</p>
          )}
        </div>
      )}
      {canEdit && !detail.closedOn && (
        <Button variant="secondary" size="sm" onClick={() => setEditing(true)}>
          Edit case details
        </Button>
      )}
    </div>
  );
}

function valuesOf(detail: CaseDetailDto): Input {
  return {
    bodyRegions: detail.bodyRegions ?? [],
    onsetDate: detail.onsetDate,
    diagnosis: detail.diagnosis ?? '',
    clinicalNotes: detail.clinicalNotes ?? '',
    reviewDate: detail.reviewDate ?? '',
    version: detail.version,
  };
}

function EditCaseForm({ orgId, detail, onDone }: { orgId: string; detail: CaseDetailDto; onDone: () => void }) {
  const queryClient = useQueryClient();
  const update = useUpdateCase(orgId, detail.id);
  const {
    control,
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, dirtyFields, isDirty },
  } = useForm<Input, unknown, Output>({ resolver: zodResolver(CaseUpdateSchema), defaultValues: valuesOf(detail) });

  const stale = isApiError(update.error) && update.error.code === 'version_conflict';

  // Only what was changed is sent, so the audit trail records just those fields.
  const onSubmit = handleSubmit((values) => {
    const changed: Output = { version: values.version };
    for (const key of EDITABLE) if (dirtyFields[key]) Object.assign(changed, { [key]: values[key] });
    update.mutate(changed, {
      onSuccess: onDone,
      onError: (error) => applyServerFieldErrors(error, setError, EDITABLE),
    });
  });

  async function loadLatest() {
    const latest = await queryClient.fetchQuery({ ...getCaseQueryOptions(orgId, detail.id), staleTime: 0 }).catch(() => null);
    update.reset();
    if (latest) reset(valuesOf(latest));
  }

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Edit case details" className="space-y-3">
      {stale ? (
        <Notice tone="problem" role="alert" title="Not saved">
          <p>{STALE_CASE}</p>
          <Button variant="secondary" size="sm" className="mt-2" onClick={() => void loadLatest()}>
            Load the latest case
          </Button>
        </Notice>
      ) : (
        <ErrorNotice error={update.error} />
      )}
      <Controller
        control={control}
        name="bodyRegions"
        render={({ field }) => (
          <BodyRegionPicker value={field.value ?? []} onChange={field.onChange} onBlur={field.onBlur} error={errors.bodyRegions?.message} />
        )}
      />
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField label="Onset date" type="date" error={errors.onsetDate?.message} {...register('onsetDate')} />
        <TextField
          label="Review date"
          type="date"
          error={errors.reviewDate?.message}
          {...register('reviewDate', { setValueAs: emptyToNull })}
        />
      </div>
      <TextField
        label="Working diagnosis (clinicians only)"
        hint="Your own working label. Only clinicians on the care team see it."
        error={errors.diagnosis?.message}
        {...register('diagnosis', { setValueAs: emptyToNull })}
      />
      <TextAreaField
        label="Clinical notes (clinicians only)"
        hint="Clinicians only: the coach, the athlete and the family never see these notes."
        rows={5}
        error={errors.clinicalNotes?.message}
        {...register('clinicalNotes', { setValueAs: emptyToNull })}
      />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={update.isPending} disabled={!isDirty}>
          Save case details
        </Button>
        <Button variant="secondary" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
