import { useId, useMemo, type FormEventHandler, type ReactNode } from 'react';
import { useFieldArray, useForm, useFormContext, useWatch, type UseFieldArrayReturn } from 'react-hook-form';
import type { ExerciseDto, ProgramSessionDto } from '../../../../../policies/dto';
import { HARD_SET_DEFINITION, type EngineExercise } from '../../../../../policies/load/compliance';
import type { SessionCreateInput, Unit } from '../../../../../policies/schemas';
import { TextField } from '../../../components/ui/Field';
import { Badge } from '../../../components/ui/Panel';
import { formatDate } from '../../../lib/format';
import type { SetBreach } from './BreachList';
import { ExerciseBlock } from './ExerciseBlock';
import { ExercisePicker } from './ExercisePicker';
import { blankExercise, sessionFormResolver, sessionToForm, type SessionForm } from './session-form';
import type { SetLine } from './SetRow';

/**
 * The pieces the one-athlete session editor and the team session editor share: the form and its
 * exercise list, the heading, the date and title, and the exercises with the library picker. What
 * differs (the live check, the actions, what a save does) stays in each editor.
 */

const MAX_EXERCISES = 30;

/** The session form, checked by the schema the server applies, with its list of exercises. */
export function useSessionEditorForm(session: ProgramSessionDto) {
  const methods = useForm<SessionForm, unknown, SessionCreateInput>({
    resolver: sessionFormResolver,
    defaultValues: sessionToForm(session),
  });
  const exercises = useFieldArray({ control: methods.control, name: 'exercises' });
  const values = useWatch({ control: methods.control }) as SessionForm;
  return { methods, exercises, values };
}

/** The session's title and date as saved, its status, and (for a team session) links beside the status. */
export function SessionHeading({
  id,
  session,
  links,
}: {
  id: string;
  session: Pick<ProgramSessionDto, 'title' | 'date' | 'status'>;
  links?: ReactNode;
}) {
  const badge = <Badge>{session.status === 'published' ? 'Published' : 'Draft'}</Badge>;
  return (
    <div className="flex flex-wrap items-baseline justify-between gap-2">
      <h2 id={id} className="text-lg font-bold">
        {session.title} <span className="font-normal text-ink-2 tabular-nums">· {formatDate(session.date)}</span>
      </h2>
      {links === undefined ? (
        badge
      ) : (
        <div className="flex flex-wrap items-center gap-2">
          {links}
          {badge}
        </div>
      )}
    </div>
  );
}

/** The date and title inputs, which belong to the exercises' form (`formId`) though they stand above the actions. */
export function SessionDateTitleFields({ formId }: { formId: string }) {
  const { register, formState } = useFormContext<SessionForm>();
  return (
    // "Date" and "Title", not "Session date"/"Session title": those name the add-a-session form beside it.
    <div className="flex flex-wrap gap-3">
      <TextField label="Date" type="date" form={formId} className="w-44" error={formState.errors.date?.message} {...register('date')} />
      <TextField
        label="Title"
        form={formId}
        className="min-w-[12rem] flex-1"
        error={formState.errors.title?.message}
        {...register('title')}
      />
    </div>
  );
}

/** What the editor knows about each set and exercise from its check; a team session has no live check. */
export interface SessionChecks {
  breachesFor: (setId: string) => SetBreach[];
  linesFor: (setId: string) => SetLine[];
  exceptionFor: (setId: string) => string | null;
  swapsFor: (item: SetBreach) => EngineExercise[];
  /** Why the picker offers an exercise as ruled out on this date, or null. */
  ruledOut: (exercise: ExerciseDto) => string | null;
}

export const NO_CHECKS: SessionChecks = {
  breachesFor: () => [],
  linesFor: () => [],
  exceptionFor: () => null,
  swapsFor: () => [],
  ruledOut: () => null,
};

/** The session's exercises, each with its sets, and the library picker that adds one. */
export function SessionExercisesForm({
  formId,
  title,
  onSubmit,
  exercises,
  values,
  library,
  unit,
  checks,
}: {
  formId: string;
  title: string;
  onSubmit: FormEventHandler<HTMLFormElement>;
  exercises: UseFieldArrayReturn<SessionForm, 'exercises'>;
  values: SessionForm;
  library: ExerciseDto[];
  unit: Unit;
  checks: SessionChecks;
}) {
  const hardSetHelpId = useId();
  const byId = useMemo(() => new Map(library.map((e) => [e.id, e])), [library]);
  const { fields, append, remove, move } = exercises;
  const { ruledOut, ...setChecks } = checks;
  return (
    <form id={formId} onSubmit={onSubmit} noValidate aria-label={`Exercises of ${title}`} className="space-y-3">
      {/* The engine's meaning of "hard set", on screen where the weekly limit and the warm-up boxes are used. */}
      <p id={hardSetHelpId} className="text-sm text-ink-2">
        {HARD_SET_DEFINITION}
      </p>
      {fields.length === 0 ? (
        <p className="rounded-md border border-dashed border-rule-strong px-3 py-4 text-sm text-ink-2">
          No exercise yet. Add one from the library below.
        </p>
      ) : (
        <ol aria-label="Exercises" className="space-y-3">
          {fields.map((field, i) => (
            <ExerciseBlock
              key={field.id}
              index={i}
              count={fields.length}
              exercise={byId.get(values.exercises?.[i]?.exerciseId ?? field.exerciseId)}
              unit={unit}
              {...setChecks}
              onMove={(to) => move(i, to)}
              onRemove={() => remove(i)}
              hardSetHelpId={hardSetHelpId}
            />
          ))}
        </ol>
      )}
      <ExercisePicker
        library={library}
        ruledOut={ruledOut}
        disabled={fields.length >= MAX_EXERCISES}
        onPick={(exerciseId) => append(blankExercise(exerciseId, unit))}
      />
    </form>
  );
}
