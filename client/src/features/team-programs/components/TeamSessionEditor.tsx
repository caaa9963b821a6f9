import { useId, useState, type ReactNode } from 'react';
import { FormProvider } from 'react-hook-form';
import type { ExerciseDto, ProgramSessionDto } from '../../../../../policies/dto';
import type { Breach } from '../../../../../policies/load/compliance';
import type { Unit } from '../../../../../policies/schemas';
import { Button } from '../../../components/ui/Button';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { isApiError } from '../../../lib/api-client';
import { STALE_SESSION } from '../../programs/components/SessionActions';
import { sessionToForm } from '../../programs/components/session-form';
import {
  NO_CHECKS,
  SessionDateTitleFields,
  SessionExercisesForm,
  SessionHeading,
  useSessionEditorForm,
} from '../../programs/components/session-editor-parts';
import { useDeleteTeamSession, useEditTeamSession } from '../api/team-programs';

/**
 * Writes one team session as the coach means it for the whole group, with the single-athlete
 * editor's own pieces (exercise blocks, set rows, the library picker, the same form schema). There
 * is no live check here: on save the server fits the session to each athlete, and the review grid
 * below shows what that made of it.
 */
export function TeamSessionEditor({
  orgId,
  unit,
  session,
  library,
  athleteName,
  headerLinks,
  onSaved,
  onDeleted,
  onReload,
}: {
  orgId: string;
  unit: Unit;
  session: ProgramSessionDto;
  library: ExerciseDto[];
  athleteName: (athleteId: string) => string;
  /** A spot in the session header for links about this session (the floor sheet goes here). */
  headerLinks?: ReactNode;
  onSaved: (session: ProgramSessionDto) => void;
  onDeleted: () => void;
  onReload: () => void;
}) {
  const headingId = useId();
  const formId = useId();
  const [base, setBase] = useState(session);
  const [confirmDelete, setConfirmDelete] = useState(false);
  const { methods, exercises, values } = useSessionEditorForm(session);
  const { handleSubmit, reset, formState } = methods;
  const edit = useEditTeamSession(orgId, base.id);
  const del = useDeleteTeamSession(orgId);
  const published = base.status === 'published';
  const conflict = isApiError(edit.error) && edit.error.code === 'version_conflict';
  const refused = isApiError(edit.error) && edit.error.status === 422 ? edit.error : null;
  const refusedBreaches = (
    (refused?.details as { breaches?: { athleteId: string; breaches: Breach[] }[] } | undefined)?.breaches ?? []
  ).filter((r) => r.breaches.length);

  const save = handleSubmit((payload) =>
    edit.mutate(
      { ...payload, version: base.version },
      {
        onSuccess: (saved) => {
          setBase(saved);
          reset(sessionToForm(saved));
          onSaved(saved);
        },
      },
    ),
  );

  return (
    <section aria-labelledby={headingId} className="min-w-0 space-y-3">
      <SessionHeading
        id={headingId}
        session={base}
        links={
          // The floor sheet's links go in this spot (built separately).
          <div data-slot="session-links" className="flex flex-wrap gap-2 text-sm">
            {headerLinks}
          </div>
        }
      />
      {published && (
        <p className="text-sm text-ink-2">
          Published to the group. A change is fitted again for every athlete and must still pass each one’s limits, or nothing is saved.
        </p>
      )}
      <FormProvider {...methods}>
        <SessionDateTitleFields formId={formId} />
        <div className="flex flex-wrap items-center gap-2 rounded-lg border border-rule bg-shade p-3">
          <Button type="submit" form={formId} busy={edit.isPending} disabled={!formState.isDirty}>
            Save the team session
          </Button>
          {formState.isDirty ? (
            <span className="text-sm text-ink-2">Unsaved changes</span>
          ) : (
            <span className="text-sm text-ink-2">Saved</span>
          )}
          <span className="flex-1" />
          {confirmDelete ? (
            <span className="flex flex-wrap items-center gap-2 text-sm">
              {published ? 'Delete it and take every athlete’s version back?' : 'Delete this draft and every athlete’s version of it?'}
              <Button size="sm" variant="danger" busy={del.isPending} onClick={() => del.mutate(base.id, { onSuccess: onDeleted })}>
                Yes, delete
              </Button>
              <Button size="sm" variant="secondary" onClick={() => setConfirmDelete(false)}>
                Keep it
              </Button>
            </span>
          ) : (
            <Button size="sm" variant="danger" onClick={() => setConfirmDelete(true)}>
              Delete team session
            </Button>
          )}
        </div>
        {conflict ? (
          <Notice tone="caution" role="alert" title="Not saved">
            <p>{STALE_SESSION}</p>
            <Button size="sm" variant="secondary" onClick={onReload} className="mt-2">
              Reload the team session
            </Button>
          </Notice>
        ) : refused ? (
          <Notice tone="problem" role="alert" title="Not saved">
            <p>{refused.message}</p>
            <ul className="mt-1 list-disc pl-5">
              {refusedBreaches.flatMap((r) =>
                r.breaches.map((b, i) => (
                  <li key={`${r.athleteId}:${i}`}>
                    {athleteName(r.athleteId)}: {b.message}
                  </li>
                )),
              )}
            </ul>
          </Notice>
        ) : (
          edit.isError && <ErrorNotice error={edit.error} />
        )}
        {del.isError && <ErrorNotice error={del.error} />}
        <SessionExercisesForm
          formId={formId}
          title={base.title}
          onSubmit={save}
          exercises={exercises}
          values={values}
          library={library}
          unit={unit}
          checks={NO_CHECKS}
        />
      </FormProvider>
    </section>
  );
}
