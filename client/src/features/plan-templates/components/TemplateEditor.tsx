import { useState } from 'react';
import { FormProvider } from 'react-hook-form';
import type { Unit } from '../../../../../policies/schemas';
import type { PlanTemplateDto } from '../../../../../policies/dto';
import type { PlanStage } from '../../../../../policies/load/in-force';
import { planStagesFromTemplate, templateStagesFromPlan } from '../../../../../policies/load/plan-template';
import { isApiError } from '../../../lib/api-client';
import { todayLocal } from '../../../lib/dates';
import { formatDate } from '../../../lib/format';
import { Button } from '../../../components/ui/Button';
import { TextAreaField, TextField } from '../../../components/ui/Field';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { planToForm } from '../../plans/components/plan-form';
import { GuidanceField, StageCards, StaleNotice, usePlanStagesForm } from '../../plans/components/PlanStagesForm';
import { useUpdatePlanTemplate } from '../api/plan-templates';

export const STALE_TEMPLATE =
  'Someone saved this template after you opened it, so your changes were not saved. Load the latest version, check what changed, then make your edit again.';

/**
 * Edits a template with the plan editor's own stage cards. The stages are shown dated as if a plan
 * started today, so lengths and gaps read as on a calendar; they are saved as days from the first
 * stage's start (policies/load/plan-template.ts), against the version the editor was opened at.
 */
export function TemplateEditor({
  orgId,
  template,
  unit,
  onSaved,
  onCancel,
  onLoadLatest,
}: {
  orgId: string;
  template: PlanTemplateDto;
  unit: Unit;
  onSaved: (t: PlanTemplateDto) => void;
  onCancel: () => void;
  /** Fetches the latest version; the editor reopens on it. */
  onLoadLatest: () => Promise<PlanTemplateDto | null>;
}) {
  const start = todayLocal();
  const [base, setBase] = useState(template);
  const [name, setName] = useState(template.name);
  const [description, setDescription] = useState(template.description);
  const update = useUpdatePlanTemplate(orgId, template.id);
  const toForm = (t: PlanTemplateDto) =>
    planToForm(planStagesFromTemplate(t.stages, start, () => crypto.randomUUID()) as PlanStage[], t.guidance, unit);
  const { methods, stages } = usePlanStagesForm(unit, toForm(template));
  const { handleSubmit, reset, formState } = methods;
  const stale = isApiError(update.error) && update.error.code === 'version_conflict';
  const fieldError = (f: string) => (isApiError(update.error) ? update.error.fields?.[f]?.[0] : undefined);

  const onSubmit = handleSubmit((payload) => {
    update.mutate(
      {
        name: name.trim(),
        description,
        guidance: payload.guidance,
        stages: templateStagesFromPlan(payload.stages as PlanStage[]) as never,
        version: base.version,
      },
      { onSuccess: onSaved },
    );
  });

  async function loadLatest() {
    const latest = await onLoadLatest();
    if (!latest) return;
    update.reset();
    setBase(latest);
    setName(latest.name);
    setDescription(latest.description);
    reset(toForm(latest));
  }

  return (
    <FormProvider {...methods}>
      <form onSubmit={onSubmit} noValidate aria-label="Edit the plan template" className="space-y-4">
        <p className="text-sm text-ink-2">
          Editing version {base.version}. The dates below show the stages as if a plan started today, {formatDate(start)}; the template
          keeps them as days from the first day.
        </p>
        <TextField label="Template name" value={name} onChange={(e) => setName(e.target.value)} error={fieldError('name')} />
        <TextAreaField
          label="When it fits (optional)"
          hint="For other clinicians: who this plan suits and who it does not."
          rows={2}
          value={description}
          onChange={(e) => setDescription(e.target.value)}
          error={fieldError('description')}
        />
        <StageCards stages={stages} unit={unit} />
        <GuidanceField hint="Copied into each plan started from this template, where it can be changed." />
        {stale ? (
          <StaleNotice title="Template not saved" message={STALE_TEMPLATE} onLoadLatest={() => void loadLatest()} />
        ) : (
          update.error &&
          !fieldError('name') &&
          !fieldError('description') && <ErrorNotice error={update.error} title="Template not saved" />
        )}
        {formState.submitCount > 0 && Object.keys(formState.errors).length > 0 && (
          <Notice tone="problem" role="alert" title="Not saved yet">
            <p>Some stage fields need fixing: each is marked beside the field.</p>
          </Notice>
        )}
        <div className="flex flex-wrap gap-2">
          <Button type="submit" busy={update.isPending} disabled={stale || name.trim() === ''}>
            Save template
          </Button>
          <Button variant="secondary" onClick={onCancel}>
            Cancel
          </Button>
        </div>
      </form>
    </FormProvider>
  );
}
