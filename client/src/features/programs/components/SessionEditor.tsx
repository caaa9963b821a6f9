import { useId, useMemo, useState } from 'react';
import { FormProvider } from 'react-hook-form';
import type { ExceptionDto, ExerciseDto, ProgramSessionDto } from '../../../../../policies/dto';
import { blockingBreaches, suggestSwaps } from '../../../../../policies/load/compliance';
import { inForceOn, ruleForPatterns } from '../../../../../policies/load/in-force';
import type { SessionCreateInput, Unit } from '../../../../../policies/schemas';
import { isApiError } from '../../../lib/api-client';
import { checkSession, useSessionCheck, useUpdateSession } from '../api/sessions';
import type { SetBreach } from './BreachList';
import { engineLibrary, fingerprints, liveBreaches, loadLine, type AthleteEngine } from './live-check';
import { EXCEPTION_WORDS } from './program-words';
import { SessionActions, type Refusal } from './SessionActions';
import { HoldNotice } from './HoldNotice';
import { formToCheckable, sessionToForm } from './session-form';
import { SessionDateTitleFields, SessionExercisesForm, SessionHeading, useSessionEditorForm } from './session-editor-parts';
import type { SetLine } from './SetRow';

const ISO = /^\d{4}-\d{2}-\d{2}$/;

export interface SessionEditorProps {
  orgId: string;
  unit: Unit;
  athletes: { id: string; name: string }[];
  session: ProgramSessionDto;
  library: ExerciseDto[];
  engines: AthleteEngine[];
  /** Plans, baselines or other sessions are still loading: the live check may miss something. */
  enginesPending?: boolean;
  exceptions: ExceptionDto[];
  /** Fetches the latest saved session, after someone else changed it. */
  onReload: () => Promise<ProgramSessionDto | null>;
  onDeleted: () => void;
}

/**
 * Writes one dated session and checks it while it is typed, with the same engine and the same
 * inputs the server uses. Drafts save freely; publishing is off while any set breaches, and the
 * server, which decides, is asked again on publish.
 */
export function SessionEditor({
  orgId,
  unit,
  athletes,
  session,
  library,
  engines,
  enginesPending,
  exceptions,
  onReload,
  onDeleted,
}: SessionEditorProps) {
  const headingId = useId();
  const formId = useId();
  const [base, setBase] = useState(session);
  const [refusal, setRefusal] = useState<Refusal | null>(null);
  const [conflict, setConflict] = useState(false);
  const { methods, exercises: exerciseRows, values } = useSessionEditorForm(session);
  const { handleSubmit, reset, formState } = methods;
  const update = useUpdateSession(orgId, base.id);
  const check = useSessionCheck(orgId, base.id, base.version);

  const exercises = useMemo(() => engineLibrary(library), [library]);
  const byId = useMemo(() => new Map(library.map((e) => [e.id, e])), [library]);
  const allowedLibrary = useMemo(() => library.filter((e) => !e.archived).map((e) => exercises[e.id]), [library, exercises]);
  const group = athletes.length > 1;
  const nameOf = (athleteId: string) => athletes.find((a) => a.id === athleteId)?.name ?? 'Athlete';

  // The session as it stands in the inputs, checked for each athlete of the program.
  const date = ISO.test(values.date ?? '') ? values.date : base.date;
  const live = { id: base.id, date, content: formToCheckable(values) };
  const savedPrints = fingerprints(base);
  const livePrints = fingerprints(live);
  const waivedFor = (athleteId: string) =>
    new Set(
      (check.data?.results.find((r) => r.athleteId === athleteId)?.breaches ?? [])
        // A grant covers the set as it was granted: once edited, it is checked afresh.
        .filter((b) => b.waived && savedPrints.get(b.setId) === livePrints.get(b.setId))
        .map((b) => b.setId),
    );
  const results = engines.map((engine) => ({
    engine,
    breaches: liveBreaches({ session: live, engine, exercises, unit, waived: waivedFor(engine.athleteId) }),
  }));
  const bySet = new Map<string, SetBreach[]>();
  for (const { engine, breaches } of results) {
    for (const breach of breaches) {
      bySet.set(breach.setId, [
        ...(bySet.get(breach.setId) ?? []),
        { athleteId: engine.athleteId, athleteName: group ? engine.athleteName : null, breach },
      ]);
    }
  }
  const blocking = results.map((r) => ({
    athleteId: r.engine.athleteId,
    athleteName: r.engine.athleteName,
    breaches: blockingBreaches(r.breaches),
  }));

  const setInfo = new Map(
    live.content.exercises.flatMap((e) => e.sets.map((s) => [s.id, { exerciseId: e.exerciseId, load: s.load }] as const)),
  );
  const linesFor = (setId: string): SetLine[] => {
    const info = setInfo.get(setId);
    const ex = info && exercises[info.exerciseId];
    if (!info || !ex) return [];
    return engines.flatMap((engine) => {
      const line = loadLine(engine, ex, date, info.load);
      return line ? [{ athleteName: group ? engine.athleteName : null, line }] : [];
    });
  };
  const sessionExceptions = exceptions.filter((x) => x.sessionId === base.id);
  const exceptionFor = (setId: string) => {
    const found = sessionExceptions.filter((x) => x.setIds.includes(setId));
    if (found.length === 0) return null;
    return found
      .filter((x, i) => found.findIndex((y) => y.athleteId === x.athleteId) === i)
      .map(
        (x) =>
          `${group ? `${x.athleteName}: ` : ''}${x.status === 'granted' && !x.grantedSetIds.includes(setId) ? 'Exception not granted for this set' : EXCEPTION_WORDS[x.status]}`,
      )
      .join(' · ');
  };
  const swapsFor = (item: SetBreach) => {
    const engine = engines.find((e) => e.athleteId === item.athleteId);
    const ex = exercises[item.breach.exerciseId];
    if (!engine || !ex) return [];
    return suggestSwaps(ex, allowedLibrary, inForceOn(engine.plans, item.breach.date));
  };
  const ruledOut = (exercise: ExerciseDto) => {
    for (const engine of engines) {
      const rule = ruleForPatterns(inForceOn(engine.plans, date), exercise.patterns);
      const who = group ? ` for ${engine.athleteName}` : '';
      if (rule.mode === 'blocked') return `blocked on this date${who}`;
      if (exercise.ballistic && rule.mode === 'capped' && rule.caps?.impactAllowed === false) return `no impact on this date${who}`;
    }
    return null;
  };

  function accept(saved: ProgramSessionDto) {
    setBase(saved);
    setConflict(false);
    reset(sessionToForm(saved));
  }

  async function save(payload: SessionCreateInput): Promise<ProgramSessionDto | null> {
    setRefusal(null);
    try {
      const saved = await update.mutateAsync({ ...payload, version: base.version });
      accept(saved);
      return saved;
    } catch (error) {
      if (isApiError(error) && error.code === 'version_conflict') setConflict(true);
      return null;
    }
  }

  /** Saves what is typed (when anything changed) and hands back the version to act on. */
  async function saveIfChanged(): Promise<number | null> {
    if (!formState.isDirty) return base.version;
    let payload: SessionCreateInput | null = null;
    await handleSubmit((p) => {
      payload = p;
    })();
    if (!payload) return null;
    return (await save(payload))?.version ?? null;
  }

  async function reload() {
    const latest = await onReload();
    if (latest) accept(latest);
  }

  async function explainRefusal(error: unknown) {
    const message = isApiError(error) ? error.message : 'The server refused to publish this session.';
    // The server's own check of the saved session lists what its publish refused.
    const server = await checkSession(orgId, base.id).catch(() => null);
    setRefusal({
      message,
      results: (server?.results ?? [])
        .map((r) => ({ athleteId: r.athleteId, athleteName: nameOf(r.athleteId), breaches: blockingBreaches(r.breaches) }))
        .filter((r) => r.breaches.length),
    });
  }

  const holds = (session.version === base.version ? session.holds : base.holds).filter((h) => h.breaches.length > 0);
  const published = base.status === 'published';

  return (
    <section aria-labelledby={headingId} className="min-w-0 space-y-3">
      <SessionHeading id={headingId} session={base} />
      {published &&
        holds.map((h) => (
          <HoldNotice
            key={h.athleteId}
            athleteName={nameOf(h.athleteId)}
            breaches={h.breaches}
            exercises={base.content.exercises}
            exerciseName={(id) => byId.get(id)?.name ?? 'Exercise'}
          />
        ))}
      <FormProvider {...methods}>
        <SessionDateTitleFields formId={formId} />
        <SessionActions
          orgId={orgId}
          formId={formId}
          session={base}
          athletes={athletes}
          dirty={formState.isDirty}
          saving={update.isPending}
          saveError={conflict ? null : update.error}
          conflict={conflict}
          blocking={blocking}
          waivedSets={new Set(results.flatMap((r) => r.breaches.filter((b) => b.waived).map((b) => b.setId))).size}
          empty={exerciseRows.fields.length === 0}
          checking={!!enginesPending}
          refusal={refusal}
          setLabel={(setId) => setLabel(live.content, byId, setId)}
          saveIfChanged={saveIfChanged}
          onPublished={accept}
          onRefused={(e) => void explainRefusal(e)}
          onReload={() => void reload()}
          onDeleted={onDeleted}
          clearRefusal={() => setRefusal(null)}
        />
        <SessionExercisesForm
          formId={formId}
          title={base.title}
          onSubmit={handleSubmit((p) => void save(p))}
          exercises={exerciseRows}
          values={values}
          library={library}
          unit={unit}
          checks={{ breachesFor: (setId) => bySet.get(setId) ?? [], linesFor, exceptionFor, swapsFor, ruledOut }}
        />
      </FormProvider>
    </section>
  );
}

/** "Set 2 of Deadlift", for choosing sets in an exception request. */
function setLabel(content: ReturnType<typeof formToCheckable>, byId: Map<string, ExerciseDto>, setId: string): string {
  for (const e of content.exercises) {
    const j = e.sets.findIndex((s) => s.id === setId);
    if (j >= 0) return `Set ${j + 1} of ${byId.get(e.exerciseId)?.name ?? 'an exercise'}`;
  }
  return 'A set';
}
