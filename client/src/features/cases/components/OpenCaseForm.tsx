import { Controller, useForm } from 'react-hook-form';
import { Link } from 'react-router-dom';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { CaseCreateSchema } from '../../../../../policies/schemas';
import type { CaseDto } from '../../../../../policies/dto';
import { PARTICIPATION_STATUSES, STATUS_LABELS } from '../../../../../policies/load/patterns';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { emptyToUndefined } from '../../../lib/form-values';
import { todayLocal } from '../../../lib/dates';
import { formatDateTime } from '../../../lib/format';
import { painReportHref } from '../../../lib/pain-report-href';
import { Button } from '../../../components/ui/Button';
import { SelectField, TextAreaField, TextField } from '../../../components/ui/Field';
import { ErrorNotice } from '../../../components/ui/Notice';
import { useCreateCase } from '../api/create-case';
import { BodyRegionPicker } from './BodyRegionPicker';

type Input = z.input<typeof CaseCreateSchema>;
type Output = z.output<typeof CaseCreateSchema>;

const FIELDS = ['bodyRegions', 'onsetDate', 'diagnosis', 'clinicalNotes', 'status', 'statusEffectiveFrom', 'statusNote', 'reviewDate'];

export const STATUS_HINTS = {
  out: 'no training until you say so',
  limited: 'training within the plan you write',
  full: 'cleared for full training',
} as const;

/** The pain report a case is opened from: its places and onset fill the form, and the case links to it. */
export interface CaseFromReport {
  id: string;
  reportedAt: string;
  bodyRegions: Input['bodyRegions'];
  onsetDate: string;
}

/** Opens a case with its first participation status; validated by the same schema as the server. */
export function OpenCaseForm({
  orgId,
  athleteId,
  athleteName,
  fromReport,
  onCreated,
  onCancel,
}: {
  orgId: string;
  athleteId: string;
  athleteName: string;
  fromReport?: CaseFromReport;
  onCreated: (created: CaseDto) => void;
  onCancel: () => void;
}) {
  const create = useCreateCase(orgId);
  const today = todayLocal();
  const {
    control,
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<Input, unknown, Output>({
    resolver: zodResolver(CaseCreateSchema),
    defaultValues: fromReport
      ? {
          athleteId,
          bodyRegions: [...fromReport.bodyRegions],
          onsetDate: fromReport.onsetDate,
          statusEffectiveFrom: today,
          painReportId: fromReport.id,
        }
      : { athleteId, bodyRegions: [], onsetDate: today, statusEffectiveFrom: today },
  });

  const onSubmit = handleSubmit((values) =>
    create.mutate(values, {
      onSuccess: onCreated,
      onError: (error) => applyServerFieldErrors(error, setError, FIELDS),
    }),
  );

  return (
    <form onSubmit={onSubmit} noValidate aria-label={`Open a case for ${athleteName}`} className="space-y-4">
      <ErrorNotice error={create.error} />
      {fromReport && (
        <p className="text-sm text-ink-2">
          Filled in from <Link to={painReportHref(fromReport.id)}>the pain report of {formatDateTime(fromReport.reportedAt)}</Link>; the
          case will link to it. Check the places and the onset date before you open it.
        </p>
      )}
      <Controller
        control={control}
        name="bodyRegions"
        render={({ field }) => (
          <BodyRegionPicker value={field.value} onChange={field.onChange} onBlur={field.onBlur} error={errors.bodyRegions?.message} />
        )}
      />
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField label="Onset date" type="date" max={today} error={errors.onsetDate?.message} {...register('onsetDate')} />
        <TextField
          label="Working diagnosis (clinicians only)"
          hint="Your own working label. Only clinicians on the care team see it."
          error={errors.diagnosis?.message}
          {...register('diagnosis', { setValueAs: emptyToUndefined })}
        />
      </div>
      <TextAreaField
        label="Clinical notes (clinicians only)"
        hint="Clinicians only: the coach, the athlete and the family never see these notes."
        rows={4}
        error={errors.clinicalNotes?.message}
        {...register('clinicalNotes', { setValueAs: emptyToUndefined })}
      />
      <div className="grid gap-3 sm:grid-cols-3">
        <SelectField label="Status" error={errors.status?.message} {...register('status', { setValueAs: emptyToUndefined })}>
          <option value="">Choose…</option>
          {PARTICIPATION_STATUSES.map((s) => (
            <option key={s} value={s}>
              {STATUS_LABELS[s]} — {STATUS_HINTS[s]}
            </option>
          ))}
        </SelectField>
        <TextField label="Status from" type="date" error={errors.statusEffectiveFrom?.message} {...register('statusEffectiveFrom')} />
        <TextField
          label="Review date"
          type="date"
          min={today}
          error={errors.reviewDate?.message}
          {...register('reviewDate', { setValueAs: emptyToUndefined })}
        />
      </div>
      <TextAreaField
        label="Note for the athlete and family"
        hint={`In plain words: ${athleteName}, their guardians and coach read this with the status.`}
        rows={2}
        error={errors.statusNote?.message}
        {...register('statusNote', { setValueAs: emptyToUndefined })}
      />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={create.isPending}>
          Save case
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
