import { useFieldArray, useFormContext, useWatch, type FieldError } from 'react-hook-form';
import type { CriterionKind, RecordRule } from '../../../../../policies/load/stage-criteria';
import { RECORD_RULES } from '../../../../../policies/load/stage-criteria';
import { StageCriterionSchema } from '../../../../../policies/schemas';
import { plainCriterion } from '../../../../../policies/plain-words';
import { Button } from '../../../components/ui/Button';
import { SelectField, TextField } from '../../../components/ui/Field';
import { blankCriterion, criterionToPayload, type CriterionForm, type PlanForm } from './plan-form';

/** The schema's limit on criteria per stage (policies/schemas/stage-criteria.ts). */
export const MAX_CRITERIA = 12;

export const KIND_WORDS: Record<CriterionKind, string> = {
  record: 'From the record',
  clinician: 'Assessed by the clinician',
  athlete: 'Reported by the athlete',
};

export const RULE_WORDS: Record<RecordRule, string> = {
  pain_settled_sessions: 'Pain settled: sessions in a row with low pain, no worse next morning',
  no_red_flags: 'No warning-sign answer since the stage began',
  sessions_logged: 'Sessions logged in this stage',
  rpe_at_most: 'Planned sessions in a row at or under a session effort',
};

/** The words each criterion field is shown with, shared by the inputs and the summary by the Save button. */
export const CRITERION_FIELD_WORDS: Record<string, string> = {
  rule: 'Rule',
  count: 'Sessions needed',
  maxPain: 'Highest pain during',
  maxRpe: 'Highest session effort',
  label: 'What is assessed',
  measure: 'Recorded as',
  threshold: 'Threshold',
  direction: 'Met when the value is',
  unit: 'Unit',
  id: 'Criterion id',
  kind: 'Kind',
};

/** A field's words for one kind of criterion (the athlete's threshold is their readiness). */
export function criterionFieldWords(kind: CriterionKind | undefined, field: string): string {
  if (kind === 'athlete' && field === 'threshold') return 'Readiness needed';
  return CRITERION_FIELD_WORDS[field] ?? field;
}

type CriterionErrors = Partial<Record<keyof CriterionForm, FieldError>>;

/**
 * A stage's exit criteria, edited with the plan and saved with its version. The shared schema checks
 * them with the rest of the plan; each field shows its own problem, and a valid criterion shows the
 * plain words the athlete and family will read.
 */
export function StageCriteriaEditor({ stageIndex }: { stageIndex: number }) {
  const { control, formState } = useFormContext<PlanForm>();
  const { fields, append, remove } = useFieldArray({ control, name: `stages.${stageIndex}.criteria`, keyName: 'key' });
  const stageNumber = stageIndex + 1;
  const listError = formState.errors.stages?.[stageIndex]?.criteria as { message?: string; root?: { message?: string } } | undefined;
  const listMessage = listError?.root?.message ?? listError?.message;

  return (
    <div className="mt-4">
      <p className="mb-1 text-sm font-semibold">Exit criteria (optional)</p>
      <p className="mb-2 text-xs text-muted">
        What has to be true before the next stage. The app shows each one&apos;s state; moving on stays a decision you make with the
        athlete. With none, the stage moves on by its dates.
      </p>
      {listMessage && (
        <p role="alert" className="mb-2 text-sm font-semibold text-line-deep">
          ▲ Criteria {listMessage}
        </p>
      )}
      <ol className="space-y-3">
        {fields.map((field, j) => (
          <li key={field.key}>
            <CriterionEditor stageIndex={stageIndex} index={j} onRemove={() => remove(j)} />
          </li>
        ))}
      </ol>
      <div className="mt-2 flex flex-wrap gap-2" role="group" aria-label={`Add an exit criterion to stage ${stageNumber}`}>
        {(Object.keys(KIND_WORDS) as CriterionKind[]).map((kind) => (
          <Button
            key={kind}
            size="sm"
            variant="secondary"
            disabled={fields.length >= MAX_CRITERIA}
            onClick={() => append(blankCriterion(kind))}
          >
            + {KIND_WORDS[kind]}
          </Button>
        ))}
      </div>
    </div>
  );
}

function CriterionEditor({ stageIndex, index, onRemove }: { stageIndex: number; index: number; onRemove: () => void }) {
  const { register, control, formState, setValue } = useFormContext<PlanForm>();
  const name = `stages.${stageIndex}.criteria.${index}` as const;
  const c = useWatch({ control, name }) as CriterionForm | undefined;
  const errors = (formState.errors.stages?.[stageIndex]?.criteria?.[index] ?? {}) as CriterionErrors;
  if (!c) return null;
  const number = index + 1;
  const e = (field: keyof CriterionForm) => errors[field]?.message;
  const parsed = StageCriterionSchema.safeParse(criterionToPayload(c));
  // The selects are controlled from the watched values, so what is shown is always what is saved.
  const choose = (field: 'rule' | 'measure' | 'direction', value: string) =>
    setValue(`${name}.${field}`, value as never, { shouldDirty: true, shouldValidate: formState.isSubmitted });
  const legend = `Criterion ${number}: ${KIND_WORDS[c.kind]}`;

  return (
    <fieldset className="min-w-0 rounded-md border border-rule p-3">
      <legend className="px-1 text-sm font-semibold">{legend}</legend>
      <div className="grid gap-3 sm:grid-cols-2">
        {c.kind === 'record' && (
          <>
            <SelectField
              label={CRITERION_FIELD_WORDS.rule}
              className="sm:col-span-2"
              error={e('rule')}
              value={c.rule}
              onChange={(ev) => choose('rule', ev.target.value)}
            >
              {RECORD_RULES.map((r) => (
                <option key={r} value={r}>
                  {RULE_WORDS[r]}
                </option>
              ))}
            </SelectField>
            {c.rule !== 'no_red_flags' && (
              <TextField
                label={CRITERION_FIELD_WORDS.count}
                inputMode="numeric"
                hint={c.rule === 'sessions_logged' ? 'In all, in this stage' : 'In a row'}
                error={e('count')}
                {...register(`${name}.count`)}
              />
            )}
            {c.rule === 'pain_settled_sessions' && (
              <TextField
                label={CRITERION_FIELD_WORDS.maxPain}
                inputMode="numeric"
                hint="Out of 10; a session at or under it counts"
                error={e('maxPain')}
                {...register(`${name}.maxPain`)}
              />
            )}
            {c.rule === 'rpe_at_most' && (
              <TextField
                label={CRITERION_FIELD_WORDS.maxRpe}
                inputMode="numeric"
                hint="Session RPE out of 10, at the planned load"
                error={e('maxRpe')}
                {...register(`${name}.maxRpe`)}
              />
            )}
          </>
        )}
        {c.kind === 'clinician' && (
          <>
            <TextField
              label={CRITERION_FIELD_WORDS.label}
              className="sm:col-span-2"
              placeholder="e.g. Side plank hold, each side"
              hint="The athlete and family read it as written"
              error={e('label')}
              {...register(`${name}.label`)}
            />
            <SelectField
              label={CRITERION_FIELD_WORDS.measure}
              error={e('measure')}
              value={c.measure}
              onChange={(ev) => choose('measure', ev.target.value)}
            >
              <option value="threshold">A measured value against a threshold</option>
              <option value="yes_no">Yes or no (a clinical judgement)</option>
            </SelectField>
            {c.measure === 'threshold' && (
              <>
                <SelectField
                  label={CRITERION_FIELD_WORDS.direction}
                  error={e('direction')}
                  value={c.direction}
                  onChange={(ev) => choose('direction', ev.target.value)}
                >
                  <option value="at_least">At least the threshold</option>
                  <option value="at_most">At most the threshold</option>
                </SelectField>
                <TextField
                  label={CRITERION_FIELD_WORDS.threshold}
                  inputMode="decimal"
                  error={e('threshold')}
                  {...register(`${name}.threshold`)}
                />
                <TextField
                  label={`${CRITERION_FIELD_WORDS.unit} (optional)`}
                  placeholder="e.g. s, °, %"
                  error={e('unit')}
                  {...register(`${name}.unit`)}
                />
              </>
            )}
          </>
        )}
        {c.kind === 'athlete' && (
          <TextField
            label={criterionFieldWords('athlete', 'threshold')}
            inputMode="numeric"
            hint="0–10: met when the athlete's own rating is at or above it"
            error={e('threshold')}
            {...register(`${name}.threshold`)}
          />
        )}
      </div>
      <div className="mt-2 flex flex-wrap items-start justify-between gap-2">
        <p className="min-w-0 flex-1 text-sm text-ink-2" aria-live="polite">
          {parsed.success ? (
            <>
              <span className="font-semibold">The athlete reads: </span>
              {plainCriterion(parsed.data)}
            </>
          ) : (
            <span className="text-muted">Fill in the fields to see what the athlete reads.</span>
          )}
        </p>
        <Button size="sm" variant="danger" onClick={onRemove} aria-label={`Remove criterion ${number} of stage ${stageIndex + 1}`}>
          Remove
        </Button>
      </div>
    </fieldset>
  );
}
