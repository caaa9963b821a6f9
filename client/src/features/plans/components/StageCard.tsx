import { useId } from 'react';
import { useFormContext, useWatch } from 'react-hook-form';
import type { Unit } from '../../../../../policies/schemas';
import { ceilingWarning } from '../../../../../policies/load/pain-rule';
import { Button } from '../../../components/ui/Button';
import { cx } from '../../../components/ui/cx';
import { fieldSentence } from '../../../lib/form-errors';
import { TextField } from '../../../components/ui/Field';
import { liveStageIssues, type PlanForm } from './plan-form';
import { StagePatterns } from './StagePatterns';
import { StageCriteriaEditor } from './StageCriteriaEditor';
import { daysInclusive } from './plan-words';

/**
 * Date clashes with the other stages, from the shared rule, as soon as a date changes. Only the
 * dates are watched, so typing a cap does not redraw every stage.
 */
function useLiveIssues(index: number, count: number) {
  const { control } = useFormContext<PlanForm>();
  const names = Array.from({ length: count }, (_, i) => [`stages.${i}.startDate`, `stages.${i}.endDate`] as const).flat();
  const dates = useWatch({ control, name: names }) as string[];
  const stages = Array.from({ length: count }, (_, i) => ({ startDate: dates[2 * i] ?? '', endDate: dates[2 * i + 1] ?? '' }));
  return {
    issues: liveStageIssues(stages).filter((issue) => issue.stage === index),
    start: stages[index]?.startDate ?? '',
    end: stages[index]?.endDate ?? '',
  };
}

/** One stage: its dates, review and pain ceiling, then the movement patterns it limits (StagePatterns). */
export function StageCard({
  index,
  count,
  unit,
  onMove,
  onRemove,
}: {
  index: number;
  count: number;
  unit: Unit;
  onMove: (to: number) => void;
  onRemove: () => void;
}) {
  const { register, formState, control } = useFormContext<PlanForm>();
  const ceilingText = useWatch({ control, name: `stages.${index}.painCeiling` });
  // A warning, not a refusal: the clinician may set a higher ceiling, but should know the model's is 5.
  const warning = ceilingText?.trim() ? ceilingWarning(Number(ceilingText)) : null;
  const errors = formState.errors.stages?.[index];
  const { issues, start, end } = useLiveIssues(index, count);
  const number = index + 1;
  const painId = useId();
  const live = (field: 'startDate' | 'endDate') => issues.find((i) => i.field === field)?.message;
  const days = /^\d{4}-\d{2}-\d{2}$/.test(start) && /^\d{4}-\d{2}-\d{2}$/.test(end) ? daysInclusive(start, end) : null;

  return (
    <fieldset className="min-w-0 rounded-lg border border-rule-strong bg-sheet px-3 pt-1 pb-3 sm:px-4">
      <legend className="px-1 text-base font-bold">Stage {number}</legend>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <p className="text-sm text-muted tabular-nums" aria-live="polite">
          {days !== null && days > 0 ? `${days} ${days === 1 ? 'day' : 'days'}, both ends included` : 'Set the dates'}
        </p>
        <div className="flex flex-wrap gap-1">
          <Button
            size="sm"
            variant="secondary"
            disabled={index === 0}
            onClick={() => onMove(index - 1)}
            aria-label={`Move stage ${number} up`}
          >
            ↑ Up
          </Button>
          <Button
            size="sm"
            variant="secondary"
            disabled={index === count - 1}
            onClick={() => onMove(index + 1)}
            aria-label={`Move stage ${number} down`}
          >
            ↓ Down
          </Button>
          <Button size="sm" variant="danger" disabled={count === 1} onClick={onRemove} aria-label={`Remove stage ${number}`}>
            Remove
          </Button>
        </div>
      </div>

      <div className="mt-2 grid gap-3 sm:grid-cols-2 lg:grid-cols-[1.4fr_1fr_1fr_1fr_0.8fr]">
        <TextField
          label="Label (optional)"
          placeholder="e.g. Protect"
          error={errors?.label?.message}
          {...register(`stages.${index}.label`)}
        />
        <TextField
          label="Start date"
          type="date"
          error={errors?.startDate?.message ?? live('startDate')}
          {...register(`stages.${index}.startDate`)}
        />
        <TextField
          label="End date"
          type="date"
          error={errors?.endDate?.message ?? live('endDate')}
          {...register(`stages.${index}.endDate`)}
        />
        <TextField label="Review date" type="date" error={errors?.reviewDate?.message} {...register(`stages.${index}.reviewDate`)} />
        <div>
          <label htmlFor={painId} className="block text-sm font-semibold">
            Pain ceiling
          </label>
          <span className="mt-1 flex items-center gap-1.5">
            <input
              id={painId}
              type="number"
              inputMode="numeric"
              min={0}
              max={10}
              step={1}
              aria-invalid={errors?.painCeiling ? true : undefined}
              aria-describedby={cx(`${painId}-of`, errors?.painCeiling && `${painId}-error`, warning && `${painId}-warning`) || undefined}
              className="block min-h-10 w-20 rounded-md border border-rule-strong bg-sheet px-3 text-sm tabular-nums aria-[invalid=true]:border-2 aria-[invalid=true]:border-line-deep"
              {...register(`stages.${index}.painCeiling`)}
            />
            <span id={`${painId}-of`} className="text-sm text-muted">
              out of 10
            </span>
          </span>
          {errors?.painCeiling?.message && (
            <p id={`${painId}-error`} className="mt-1 flex items-start gap-1.5 text-sm font-semibold text-line-deep">
              <span aria-hidden="true">▲</span>
              <span>{fieldSentence('Pain ceiling', errors.painCeiling.message)}</span>
            </p>
          )}
        </div>
      </div>
      <p id={`${painId}-warning`} role="status" className={cx('text-sm', warning && 'mt-2 border-l-4 border-line pl-2 font-semibold')}>
        {warning}
      </p>

      <div className="mt-4">
        <p className="mb-1 text-sm font-semibold">Movement patterns</p>
        <p className="mb-2 text-xs text-muted">
          Free: no limits. Blocked: not allowed. Capped: allowed within the limits you fill in (at least one); a box left empty sets no
          limit.
        </p>
        <StagePatterns stageIndex={index} unit={unit} />
      </div>
      <StageCriteriaEditor stageIndex={index} />
    </fieldset>
  );
}
