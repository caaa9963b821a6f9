import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { CheckInSchema } from '../../../../../policies/schemas';
import type { CheckInDto } from '../../../../../policies/dto';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { formatDate } from '../../../lib/format';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { ScoreField } from '../../../components/ui/ScoreField';
import { useCreateCheckIn } from '../api/create-check-in';

type Input = z.input<typeof CheckInSchema>;
type Output = z.output<typeof CheckInSchema>;

const FIELDS = ['sleepHours', 'soreness', 'readiness', 'painNow'] as const;
const toNumber = (v: unknown) => (typeof v === 'string' ? (v.trim() === '' ? undefined : Number(v)) : v);
/** The − and + buttons move by half an hour; from an empty box they start at 8 hours. */
const step = (v: unknown, by: number) => Math.min(16, Math.max(0, (typeof v === 'number' && !Number.isNaN(v) ? v : 8) + by));

/**
 * The morning check-in: four answers and one button. Today's answers, if already given, are the
 * starting point; saving again replaces them.
 */
export function CheckInForm({
  orgId,
  athleteId,
  date,
  existing,
}: {
  orgId: string;
  athleteId: string;
  date: string;
  existing?: CheckInDto;
}) {
  const save = useCreateCheckIn(orgId);
  const {
    control,
    register,
    handleSubmit,
    setError,
    setValue,
    formState: { errors },
  } = useForm<Input, unknown, Output>({
    resolver: zodResolver(CheckInSchema),
    defaultValues: existing
      ? {
          athleteId,
          date,
          sleepHours: existing.sleepHours,
          soreness: existing.soreness,
          readiness: existing.readiness,
          painNow: existing.painNow,
        }
      : { athleteId, date },
  });
  const sleep = useWatch({ control, name: 'sleepHours' });

  const onSubmit = handleSubmit((values) =>
    save.mutate(values, { onError: (error) => applyServerFieldErrors(error, setError, [...FIELDS, 'date']) }),
  );

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Daily check-in" className="space-y-6">
      {existing && !save.isSuccess && (
        <Notice tone="info">
          <p>You already checked in today. Saving again replaces those answers.</p>
        </Notice>
      )}
      <div className="flex items-end gap-2">
        <TextField
          label="Sleep last night (hours)"
          type="number"
          inputMode="decimal"
          min={0}
          max={16}
          step={0.5}
          large
          className="w-56"
          error={errors.sleepHours?.message}
          {...register('sleepHours', { setValueAs: toNumber })}
        />
        <Button
          variant="secondary"
          aria-label="Half an hour less"
          className="size-12 shrink-0 text-xl"
          onClick={() => setValue('sleepHours', step(sleep, -0.5))}
        >
          −
        </Button>
        <Button
          variant="secondary"
          aria-label="Half an hour more"
          className="size-12 shrink-0 text-xl"
          onClick={() => setValue('sleepHours', step(sleep, 0.5))}
        >
          +
        </Button>
      </div>
      <ScoreField
        control={control}
        name="soreness"
        label="Soreness"
        low="Not sore"
        high="As sore as can be"
        error={errors.soreness?.message}
      />
      <ScoreField
        control={control}
        name="readiness"
        label="Ready to train"
        low="Not ready at all"
        high="Ready for anything"
        error={errors.readiness?.message}
      />
      <ScoreField
        control={control}
        name="painNow"
        label="Pain now"
        low="No pain"
        high="Worst pain you can imagine"
        error={errors.painNow?.message}
      />
      <ErrorNotice error={save.error} title="Check-in not saved" />
      {save.isSuccess &&
        ('sent' in save.data ? (
          <Notice tone="done" role="status" title={`Checked in for ${formatDate(save.data.sent.date)}. Thank you.`}>
            <p>Your care team sees it. If pain is new or worse, report it too.</p>
          </Notice>
        ) : (
          <Notice tone="info" role="status" title="Saved on this phone">
            <p>Loadline can&apos;t be reached right now. Your check-in is sent as soon as it can be; your page shows it until then.</p>
          </Notice>
        ))}
      <Button type="submit" size="lg" busy={save.isPending}>
        Save check-in
      </Button>
    </form>
  );
}
