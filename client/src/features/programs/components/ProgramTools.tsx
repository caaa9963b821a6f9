import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { weekOf } from '../../../../../policies/load/compliance';
import { CopyWeekSchema, ShiftDatesSchema } from '../../../../../policies/schemas';
import { Button } from '../../../components/ui/Button';
import { SelectField, TextField } from '../../../components/ui/Field';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { addDaysIso } from '../../../lib/dates';
import { useCopyWeek, useShiftDates, type CopyWeekInput, type ShiftDatesInput } from '../api/program-dates';
import { plural, weekLabel } from './program-words';

/** Copy a week's sessions to another week (as drafts), or move drafts by some days. */
export function ProgramTools({
  orgId,
  programId,
  weeks,
  onChanged,
}: {
  orgId: string;
  programId: string;
  /** Mondays of the weeks that have sessions. */
  weeks: string[];
  onChanged: () => void;
}) {
  return (
    <details className="rounded-md border border-rule bg-sheet px-3 py-2 text-sm">
      <summary className="cursor-pointer font-semibold">Copy a week or shift dates</summary>
      <div className="mt-2 space-y-4">
        <CopyWeekForm orgId={orgId} programId={programId} weeks={weeks} onChanged={onChanged} />
        <ShiftDatesForm orgId={orgId} programId={programId} onChanged={onChanged} />
      </div>
    </details>
  );
}

function CopyWeekForm({
  orgId,
  programId,
  weeks,
  onChanged,
}: {
  orgId: string;
  programId: string;
  weeks: string[];
  onChanged: () => void;
}) {
  const copy = useCopyWeek(orgId, programId);
  const [done, setDone] = useState<string | null>(null);
  const last = weeks[weeks.length - 1];
  const { register, handleSubmit, formState } = useForm<CopyWeekInput>({
    resolver: zodResolver(CopyWeekSchema),
    defaultValues: { fromWeekStart: last ?? '', toWeekStart: last ? addDaysIso(last, 7) : '' },
  });
  // Whatever day is picked, the copy lands in that day's week, on the same weekdays.
  const onSubmit = handleSubmit((input) =>
    copy.mutate(
      { fromWeekStart: input.fromWeekStart, toWeekStart: weekOf(input.toWeekStart) },
      {
        onSuccess: (copies) => {
          setDone(`Copied ${plural(copies.length, 'session')} to the ${weekLabel(weekOf(input.toWeekStart)).toLowerCase()}, as drafts.`);
          onChanged();
        },
      },
    ),
  );
  if (weeks.length === 0) return <p className="text-ink-2">Copying needs a week with sessions.</p>;
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Copy a week" className="space-y-2">
      <SelectField label="Copy the sessions of" error={formState.errors.fromWeekStart?.message} {...register('fromWeekStart')}>
        {weeks.map((w) => (
          <option key={w} value={w}>
            {weekLabel(w)}
          </option>
        ))}
      </SelectField>
      <TextField
        label="To the week of"
        type="date"
        hint="Any day of that week."
        error={formState.errors.toWeekStart?.message}
        {...register('toWeekStart')}
      />
      <Button type="submit" size="sm" variant="secondary" busy={copy.isPending}>
        Copy week
      </Button>
      {copy.isError && <ErrorNotice error={copy.error} />}
      {done && (
        <Notice tone="done" role="status">
          <p>{done}</p>
        </Notice>
      )}
    </form>
  );
}

function ShiftDatesForm({ orgId, programId, onChanged }: { orgId: string; programId: string; onChanged: () => void }) {
  const shift = useShiftDates(orgId, programId);
  const [done, setDone] = useState<string | null>(null);
  const { register, handleSubmit, formState } = useForm<ShiftDatesInput>({
    resolver: zodResolver(ShiftDatesSchema),
    defaultValues: { fromDate: '', days: 7 },
  });
  const onSubmit = handleSubmit((input) =>
    shift.mutate(input, {
      onSuccess: (result) => {
        setDone(`Moved ${plural(result.moved, 'draft')} by ${plural(input.days, 'day')}. ${result.note}`);
        onChanged();
      },
    }),
  );
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Shift dates" className="space-y-2">
      <TextField label="Move drafts from" type="date" error={formState.errors.fromDate?.message} {...register('fromDate')} />
      <TextField
        label="By how many days"
        inputMode="numeric"
        hint="Negative moves them earlier. Published sessions keep their dates."
        error={formState.errors.days?.message}
        {...register('days', { valueAsNumber: true })}
      />
      <Button type="submit" size="sm" variant="secondary" busy={shift.isPending}>
        Shift dates
      </Button>
      {shift.isError && <ErrorNotice error={shift.error} />}
      {done && (
        <Notice tone="done" role="status">
          <p>{done}</p>
        </Notice>
      )}
    </form>
  );
}
