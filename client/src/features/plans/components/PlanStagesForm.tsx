import { useMemo } from 'react';
import { useFieldArray, useForm, useFormContext, type DefaultValues } from 'react-hook-form';
import type { PlanCreateInput, Unit } from '../../../../../policies/schemas';
import { Button } from '../../../components/ui/Button';
import { TextAreaField } from '../../../components/ui/Field';
import { Notice } from '../../../components/ui/Notice';
import { blankStage, planFormResolver, type PlanForm } from './plan-form';
import { StageCard } from './StageCard';

/**
 * What the plan editor and the template editor share: one form over the plan's stages and guidance,
 * checked by the same resolver, its stage cards with "Add stage", the guidance field and the notice
 * for a save refused because someone saved first. Each editor keeps only what is its own around them.
 */

/** The most stages a plan (or a template) holds, as the shared schema allows. */
export const MAX_STAGES = 20;

/** The form over the stages and guidance, validated as the server will (the shared schema and stage rule). */
export function usePlanStagesForm(unit: Unit, defaultValues: DefaultValues<PlanForm>) {
  const resolver = useMemo(() => planFormResolver(unit), [unit]);
  const methods = useForm<PlanForm, unknown, PlanCreateInput>({ resolver, reValidateMode: 'onChange', defaultValues });
  const stages = useFieldArray({ control: methods.control, name: 'stages' });
  return { methods, stages };
}

type StageArray = ReturnType<typeof usePlanStagesForm>['stages'];

/** Every stage's card, to move, remove and edit, and "Add stage" after them. Inside the form's FormProvider. */
export function StageCards({ stages, unit }: { stages: StageArray; unit: Unit }) {
  const { getValues } = useFormContext<PlanForm>();
  const { fields, append, remove, move } = stages;
  return (
    <>
      <div className="space-y-4">
        {fields.map((field, index) => (
          <StageCard
            key={field.id}
            index={index}
            count={fields.length}
            unit={unit}
            onMove={(to) => move(index, to)}
            onRemove={() => remove(index)}
          />
        ))}
      </div>
      <Button variant="secondary" disabled={fields.length >= MAX_STAGES} onClick={() => append(blankStage(getValues('stages').at(-1)))}>
        Add stage
      </Button>
    </>
  );
}

/** The guidance for the athlete and family, with each editor's own hint. */
export function GuidanceField({ hint }: { hint: string }) {
  const { register, formState } = useFormContext<PlanForm>();
  return (
    <TextAreaField
      label="Guidance for the athlete and family"
      hint={hint}
      rows={3}
      error={formState.errors.guidance?.message}
      {...register('guidance')}
    />
  );
}

/** A save refused because someone saved since the editor opened (409): what happened, and the way on. */
export function StaleNotice({ title, message, onLoadLatest }: { title: string; message: string; onLoadLatest: () => void }) {
  return (
    <Notice tone="problem" role="alert" title={title}>
      <p>{message}</p>
      <Button variant="secondary" size="sm" className="mt-2" onClick={onLoadLatest}>
        Load the latest version
      </Button>
    </Notice>
  );
}
