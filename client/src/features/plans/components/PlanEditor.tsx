import { useId, useState } from 'react';
import { FormProvider, type FieldErrors } from 'react-hook-form';
import { useQueryClient } from '@tanstack/react-query';
import type { Unit } from '../../../../../policies/schemas';
import type { PlanDto } from '../../../../../policies/dto';
import { PATTERN_LABELS, MOVEMENT_PATTERNS } from '../../../../../policies/load/patterns';
import { isApiError } from '../../../lib/api-client';
import { fieldSentence } from '../../../lib/form-errors';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { useCreatePlan } from '../api/create-plan';
import { useUpdatePlan } from '../api/update-plan';
import { getPlanQueryOptions } from '../api/get-plan';
import { blankStage, copiedStages, planToForm, type PlanForm } from './plan-form';
import { CAP_COLUMNS } from './plan-words';
import { GuidanceField, StageCards, StaleNotice, usePlanStagesForm } from './PlanStagesForm';
import { criterionFieldWords } from './StageCriteriaEditor';
import { StartFromTemplate } from '../../plan-templates/components/StartFromTemplate';

export const STALE_PLAN =
  'Someone saved this plan after you opened it, so your changes were not saved. Load the latest version, check what changed, then make your edit again.';

export interface CopySource {
  planId: string;
  label: string;
}

const STAGE_FIELD_WORDS: Record<string, string> = {
  label: 'Label',
  startDate: 'Start date',
  endDate: 'End date',
  reviewDate: 'Review date',
  painCeiling: 'Pain ceiling',
  stageId: 'Stage id',
};

/** Problems of the stages' exit criteria, each named by stage, criterion number and field. */
function criteriaProblems(errors: FieldErrors<PlanForm>, values: PlanForm): string[] {
  const out: string[] = [];
  const stageErrors = (errors.stages ?? {}) as Record<string, { criteria?: unknown } | undefined>;
  for (const [key, stage] of Object.entries(stageErrors)) {
    if (!/^\d+$/.test(key) || !stage?.criteria) continue;
    const i = Number(key);
    const list = stage.criteria as Record<string, Record<string, { message?: string } | undefined> | undefined> & {
      message?: string;
      root?: { message?: string };
    };
    const listMessage = list.root?.message ?? list.message;
    if (typeof listMessage === 'string') out.push(`Stage ${i + 1}: ${fieldSentence('Criteria', listMessage)}`);
    for (const [ck, fieldsOf] of Object.entries(list)) {
      if (!/^\d+$/.test(ck) || !fieldsOf) continue;
      const kind = values.stages[i]?.criteria[Number(ck)]?.kind;
      for (const [field, err] of Object.entries(fieldsOf)) {
        if (err?.message)
          out.push(`Stage ${i + 1}, criterion ${Number(ck) + 1}: ${fieldSentence(criterionFieldWords(kind, field), err.message)}`);
      }
    }
  }
  return out;
}

/** Every problem in one list by the Save button, in the words shown beside each field. */
function errorSummary(errors: FieldErrors<PlanForm>, values: PlanForm): string[] {
  const out: string[] = [];
  const stagesRoot = errors.stages?.root?.message ?? errors.stages?.message;
  if (stagesRoot) out.push(fieldSentence('Stages', stagesRoot) ?? stagesRoot);
  const stageErrors = (errors.stages ?? {}) as Record<string, FieldErrors<PlanForm['stages'][number]> | undefined>;
  for (const [key, stage] of Object.entries(stageErrors)) {
    if (!/^\d+$/.test(key) || !stage) continue;
    const i = Number(key);
    const where = `Stage ${i + 1}`;
    for (const [field, words] of Object.entries(STAGE_FIELD_WORDS)) {
      const message = (stage as Record<string, { message?: string } | undefined>)[field]?.message;
      if (message) out.push(`${where}: ${fieldSentence(words, message)}`);
    }
    for (const p of MOVEMENT_PATTERNS) {
      const rule = stage.patterns?.[p];
      if (!rule) continue;
      if (rule.caps?.message) out.push(`${where}: ${PATTERN_LABELS[p]}: ${rule.caps.message}`);
      for (const col of CAP_COLUMNS) {
        const message = rule.caps?.[col.field]?.message;
        if (message) out.push(`${where}: ${fieldSentence(`${PATTERN_LABELS[p]} ${col.name}`, message)}`);
      }
    }
  }
  out.push(...criteriaProblems(errors, values));
  if (errors.guidance?.message) out.push(fieldSentence('Guidance', errors.guidance.message) ?? errors.guidance.message);
  if (errors.changeNote?.message) out.push(fieldSentence('Change note', errors.changeNote.message) ?? errors.changeNote.message);
  return out;
}

/**
 * Writes a plan (no `plan`) or its next version. The shared schema and stage rule run on what would
 * be sent before anything leaves the browser; a save sends the version it was opened at.
 */
export function PlanEditor({
  orgId,
  caseId,
  unit,
  plan,
  copySources = [],
  onSaved,
  onCancel,
}: {
  orgId: string;
  caseId: string;
  unit: Unit;
  plan?: PlanDto;
  copySources?: CopySource[];
  onSaved: (plan: PlanDto) => void;
  onCancel: () => void;
}) {
  const queryClient = useQueryClient();
  const copyId = useId();
  const [baseVersion, setBaseVersion] = useState(plan?.version ?? 0);
  const [copyFrom, setCopyFrom] = useState('');
  const [copied, setCopied] = useState<string | null>(null);
  // The template the stages came from, named in the plan's creation audit entry (cleared by copying another plan's stages).
  const [fromTemplate, setFromTemplate] = useState<{ id: string; version: number } | null>(null);
  const create = useCreatePlan(orgId, caseId);
  const update = useUpdatePlan(orgId, plan?.id ?? '');
  const save = plan ? update : create;

  const { methods, stages } = usePlanStagesForm(
    unit,
    plan ? planToForm(plan.current.stages, plan.current.guidance, unit) : { stages: [blankStage()], guidance: '', changeNote: '' },
  );
  const { register, handleSubmit, reset, getValues, setValue, formState } = methods;
  const { replace } = stages;

  const stale = isApiError(update.error) && update.error.code === 'version_conflict';
  const problems = formState.submitCount > 0 ? errorSummary(formState.errors, getValues()) : [];

  const onSubmit = handleSubmit((payload) => {
    if (plan) update.mutate({ ...payload, version: baseVersion }, { onSuccess: onSaved });
    else create.mutate(fromTemplate ? { ...payload, fromTemplate } : payload, { onSuccess: onSaved });
  });

  async function loadLatest() {
    if (!plan) return;
    const latest = await queryClient.fetchQuery({ ...getPlanQueryOptions(orgId, plan.id), staleTime: 0 }).catch(() => null);
    if (!latest) return;
    update.reset();
    setBaseVersion(latest.version);
    reset(planToForm(latest.current.stages, latest.current.guidance, unit));
  }

  async function copyStages() {
    const source = copySources.find((s) => s.planId === copyFrom);
    if (!source) return;
    const other = await queryClient.fetchQuery(getPlanQueryOptions(orgId, source.planId)).catch(() => null);
    if (!other) {
      setCopied('That plan could not be loaded. Try again, or start from the blank stage.');
      return;
    }
    replace(copiedStages(other.current.stages, unit));
    setFromTemplate(null);
    setCopied(
      `Copied ${other.current.stages.length} ${other.current.stages.length === 1 ? 'stage' : 'stages'} from ${source.label}. ` +
        'Their dates are as they were there: check each one.',
    );
  }

  return (
    <FormProvider {...methods}>
      <form
        onSubmit={onSubmit}
        noValidate
        aria-label={plan ? 'Edit the restriction plan' : 'Write the restriction plan'}
        className="space-y-4"
      >
        {plan && (
          <p className="text-sm text-ink-2">
            Editing version {baseVersion}. Saving keeps every earlier version; the care team sees what changed.
          </p>
        )}
        {!plan && (
          <StartFromTemplate
            orgId={orgId}
            onStages={(stages, guidance, template) => {
              replace(copiedStages(stages, unit));
              setFromTemplate({ id: template.id, version: template.version });
              if (guidance && getValues('guidance').trim() === '') setValue('guidance', guidance);
            }}
          />
        )}
        {!plan && copySources.length > 0 && (
          <div className="flex flex-wrap items-end gap-2 rounded-md border border-rule p-3">
            <div className="min-w-0 flex-1 sm:flex-none">
              <label htmlFor={copyId} className="block text-sm font-semibold">
                Start from an earlier plan
              </label>
              <select
                id={copyId}
                value={copyFrom}
                onChange={(e) => setCopyFrom(e.target.value)}
                className="mt-1 block min-h-10 w-full rounded-md border border-rule-strong bg-sheet px-2 text-sm sm:w-80"
              >
                <option value="">Blank (one free stage)</option>
                {copySources.map((s) => (
                  <option key={s.planId} value={s.planId}>
                    {s.label}
                  </option>
                ))}
              </select>
            </div>
            <Button variant="secondary" disabled={!copyFrom} onClick={() => void copyStages()}>
              Copy its stages
            </Button>
            {copied && (
              <p role="status" className="w-full text-sm text-ink-2">
                {copied}
              </p>
            )}
          </div>
        )}

        <StageCards stages={stages} unit={unit} />

        <GuidanceField hint="Plain words shown with the limits to the athlete, their family and the coach, e.g. “Walk and cycle freely; no running until the review.”" />
        <TextField
          label="Change note (optional)"
          hint="For the care team: why this version. It appears in Versions."
          error={formState.errors.changeNote?.message}
          {...register('changeNote')}
        />

        {stale ? (
          <StaleNotice title="Plan not saved" message={STALE_PLAN} onLoadLatest={() => void loadLatest()} />
        ) : (
          <ErrorNotice error={save.error} title="Plan not saved" />
        )}
        {problems.length > 0 && (
          <Notice
            tone="problem"
            role="alert"
            title={`Not saved yet: ${problems.length === 1 ? 'one thing needs' : `${problems.length} things need`} fixing`}
          >
            <ul className="list-disc space-y-0.5 pl-5">
              {problems.map((p) => (
                <li key={p}>{p}</li>
              ))}
            </ul>
          </Notice>
        )}
        <div className="flex flex-wrap gap-2">
          <Button type="submit" busy={save.isPending} disabled={stale}>
            Save plan
          </Button>
          <Button variant="secondary" onClick={onCancel}>
            Cancel
          </Button>
        </div>
      </form>
    </FormProvider>
  );
}
