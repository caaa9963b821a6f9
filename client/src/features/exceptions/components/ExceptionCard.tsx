import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { ExceptionDto, ExerciseDto, ProgramSessionDto } from '../../../../../policies/dto';
import type { PlannedLoad } from '../../../../../policies/load/compliance';
import { EXCEPTION_DECISION_CAUTION } from '../../../../../policies/cautions';
import { ActionCaution } from '../../../components/Cautions';
import { formatLoad, fromUnit } from '../../../../../policies/load/units';
import { ExceptionDecisionSchema, type ExceptionDecisionInput, type Unit } from '../../../../../policies/schemas';
import { Button } from '../../../components/ui/Button';
import { TextAreaField } from '../../../components/ui/Field';
import { ErrorNotice } from '../../../components/ui/Notice';
import { formatDate, formatDateTime } from '../../../lib/format';
import { useDecideException } from '../api/exceptions';
import { findSession, useAthletePrograms, useExerciseNames } from '../api/get-session';
import type { BreachSource } from './ExceptionRequests';

function loadWords(load: PlannedLoad, unit: Unit): string {
  if (load.kind === 'bodyweight') return 'bodyweight';
  if (load.kind === 'percent') return `${load.value}% of 1RM`;
  return formatLoad(fromUnit(load.value, load.kind), unit);
}

interface RequestedSet {
  setId: string;
  label: string;
  planned: string;
}

function requestedSets(
  request: ExceptionDto,
  session: ProgramSessionDto | undefined,
  names: Map<string, ExerciseDto>,
  unit: Unit,
): RequestedSet[] {
  return request.setIds.map((setId) => {
    for (const e of session?.content.exercises ?? []) {
      const j = e.sets.findIndex((s) => s.id === setId);
      if (j < 0) continue;
      const s = e.sets[j];
      const name = names.get(e.exerciseId)?.name ?? 'an exercise';
      return {
        setId,
        label: `Set ${j + 1} of ${name}`,
        planned: `${loadWords(s.load, unit)} × ${s.reps}${s.targetRpe != null ? ` at RPE ${s.targetRpe}` : ''}`,
      };
    }
    return { setId, label: 'A set no longer in the session', planned: 'changed or removed since the request' };
  });
}

/**
 * One request: the session, each requested set with how it goes past its cap, the coach's reason —
 * and the decision: grant (all, or only the sets left ticked) or refuse, always with a note.
 */
export function ExceptionCard({
  orgId,
  unit,
  request,
  useBreaches,
}: {
  orgId: string;
  unit: Unit;
  request: ExceptionDto;
  useBreaches: BreachSource;
}) {
  const programs = useAthletePrograms(orgId, request.athleteId);
  const library = useExerciseNames(orgId);
  const session = findSession(programs.data, request.sessionId);
  const breaches = useBreaches(request.athleteId, session);
  const names = new Map((library.data ?? []).map((e) => [e.id, e]));
  const sets = requestedSets(request, session, names, unit);
  const decide = useDecideException(orgId, request.id);
  const headingId = `exception-${request.id}`;

  const { register, handleSubmit, setError, formState } = useForm<ExceptionDecisionInput & { chosen: string[] }>({
    defaultValues: { decision: 'grant', note: '', chosen: request.setIds },
  });
  const resolve = zodResolver(ExceptionDecisionSchema);

  const submit = (decision: 'grant' | 'refuse') =>
    handleSubmit(async (values) => {
      const raw = values.chosen as string[] | string | false | undefined;
      const chosen = Array.isArray(raw) ? raw : raw ? [raw] : [];
      if (decision === 'grant' && chosen.length === 0) {
        setError('chosen', { message: 'Tick at least one set to grant, or refuse the request.' });
        return;
      }
      const narrowed = decision === 'grant' && chosen.length < request.setIds.length;
      const input = { decision, note: values.note, ...(narrowed ? { setIds: chosen } : {}) };
      // The shared schema, on exactly what is sent.
      const checked = await resolve(input, undefined, { fields: {}, shouldUseNativeValidation: false });
      if (checked.errors.note) {
        setError('note', { message: checked.errors.note.message });
        return;
      }
      decide.mutate(checked.values as ExceptionDecisionInput);
    });

  return (
    <article aria-labelledby={headingId} className="rounded-lg border border-rule bg-sheet p-4">
      <h3 id={headingId} className="font-bold">
        {request.athleteName}: <span className="tabular-nums">{formatDate(request.sessionDate)}</span> · {request.sessionTitle}
      </h3>
      <p className="text-sm text-ink-2">
        Asked by {request.requestedByName ?? 'a coach'} on {formatDateTime(request.createdAt)}
        {session && ` · program ${session.programName}`}
      </p>
      <blockquote className="mt-2 border-l-4 border-rule-strong pl-3 text-sm">“{request.reason}”</blockquote>

      <form noValidate onSubmit={(e) => e.preventDefault()} className="mt-3 space-y-3">
        <fieldset>
          <legend className="text-sm font-semibold">Sets concerned — untick any you will not grant</legend>
          {programs.isPending || breaches.isPending ? <p className="text-sm text-muted">Checking the sets against the limits…</p> : null}
          {programs.isError && <ErrorNotice error={programs.error} />}
          <ul className="mt-1 space-y-2">
            {sets.map((s) => {
              const list = breaches.bySet.get(s.setId) ?? [];
              return (
                <li key={s.setId} className="rounded-md border border-rule px-3 py-2">
                  <label className="flex items-start gap-2 text-sm">
                    <input type="checkbox" value={s.setId} className="mt-0.5 size-5 shrink-0 accent-ink" {...register('chosen')} />
                    <span>
                      <span className="font-semibold">{s.label}</span> <span className="text-ink-2 tabular-nums">— {s.planned}</span>
                    </span>
                  </label>
                  {list.length > 0 ? (
                    <ul aria-label="Breaches" className="mt-1 space-y-1 pl-7 text-sm tabular-nums">
                      {list.map((b, i) => (
                        <li key={`${b.rule}-${b.pattern ?? ''}-${i}`} className="border-l-4 border-line-deep pl-2">
                          {b.message}
                        </li>
                      ))}
                    </ul>
                  ) : (
                    !breaches.isPending && <p className="pl-7 text-sm text-ink-2">Within the limits for that date as planned now.</p>
                  )}
                </li>
              );
            })}
          </ul>
          {formState.errors.chosen?.message && (
            <p className="mt-1 text-sm font-semibold text-line-deep">▲ {formState.errors.chosen.message}</p>
          )}
        </fieldset>
        <TextAreaField
          label="Decision note"
          hint="Recorded with the decision and sent to the coach."
          rows={2}
          error={formState.errors.note?.message}
          {...register('note')}
        />
        {decide.isError && <ErrorNotice error={decide.error} />}
        <ActionCaution caution={EXCEPTION_DECISION_CAUTION} />
        <div className="flex flex-wrap gap-2">
          <Button
            busy={decide.isPending && decide.variables?.decision === 'grant'}
            disabled={decide.isPending}
            onClick={() => void submit('grant')()}
          >
            Grant
          </Button>
          <Button
            variant="danger"
            busy={decide.isPending && decide.variables?.decision === 'refuse'}
            disabled={decide.isPending}
            onClick={() => void submit('refuse')()}
          >
            Refuse
          </Button>
        </div>
      </form>
    </article>
  );
}
