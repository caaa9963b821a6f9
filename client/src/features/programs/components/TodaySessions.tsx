import type { ExerciseDto, TodayDto } from '../../../../../policies/dto';
import { plannedLoadOnTheBarKg } from '../../../../../policies/load/bar-cap';
import { loadTimesReps } from '../../../../../policies/words/loads';
import type { Unit } from '../../../../../policies/schemas';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Loading } from '../../../components/ui/Panel';
import { todayLocal } from '../../../lib/dates';
import { formatDate } from '../../../lib/format';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useLibrary } from '../api/get-library';
import { useToday } from '../api/get-today';
import { PlateHelper } from './PlateHelper';

type TodaySession = TodayDto['sessions'][number];
type PlannedSet = TodaySession['content']['exercises'][number]['sets'][number];

function restWords(seconds: number): string {
  return seconds >= 60 && seconds % 30 === 0 ? `rest ${seconds / 60} min` : `rest ${seconds} s`;
}

/** A planned set as the trade writes it, "70 kg × 5", with the % of best beside it when it came from one. */
function setWords(set: PlannedSet, loadKg: number | null, unit: Unit): string {
  if (set.load.kind === 'bodyweight') return loadTimesReps(null, unit, set.reps);
  if (loadKg === null)
    return `${set.reps} reps at ${set.load.value}% of your best — work out the load with your coach (no best lift on record)`;
  const shown = loadTimesReps(loadKg, unit, set.reps);
  return set.load.kind === 'percent' ? `${shown} (${set.load.value}% of your best)` : shown;
}

/**
 * The athlete's published sessions for today, in their unit, with the plates to load for barbell
 * sets. A session on hold shows no loads at all: the limits changed and the coach must update it.
 */
export function TodaySessions({ athleteId }: { athleteId: string }) {
  const { orgId } = useCurrentMembership();
  const date = todayLocal();
  const today = useToday(orgId, athleteId, date);
  const library = useLibrary(orgId);
  const byId = new Map((library.data ?? []).map((e) => [e.id, e]));

  return (
    <section aria-labelledby="today-session-heading" className="rounded-lg border border-rule bg-sheet p-4 sm:p-5">
      <h2 id="today-session-heading" className="text-lg font-bold">
        Today&apos;s session
      </h2>
      <p className="text-sm text-ink-2 tabular-nums">
        {/* A copy of an earlier day, shown offline (lib/offline-copy.ts), names its own day, never today's. */}
        {today.data && today.data.date !== date ? `${formatDate(today.data.date)}, as saved on this phone` : formatDate(date)}
      </p>
      <div className="mt-3 space-y-4">
        {today.isPending ? (
          <Loading what="today's session" />
        ) : today.isError && !today.data ? (
          <ErrorNotice error={today.error} />
        ) : today.data.sessions.length === 0 ? (
          <p className="text-base">Nothing is planned for you today.</p>
        ) : (
          today.data.sessions.map((s) => <OneSession key={s.id} session={s} unit={today.data.unit} exercises={byId} />)
        )}
      </div>
    </section>
  );
}

function OneSession({ session, unit, exercises }: { session: TodaySession; unit: Unit; exercises: Map<string, ExerciseDto> }) {
  if (session.onHold) {
    return (
      <article aria-label={session.title}>
        <h3 className="text-base font-bold">{session.title}</h3>
        <Notice tone="caution" title="On hold until your coach updates it" className="mt-2">
          <p>
            Your limits changed after this session was written. Don&apos;t do it yet: your coach has been told and will send an updated one.
          </p>
        </Notice>
      </article>
    );
  }
  return (
    <article aria-label={session.title}>
      <h3 className="text-base font-bold">{session.title}</h3>
      <p className="text-sm text-muted">{session.programName}</p>
      <ol className="mt-2 space-y-3">
        {session.content.exercises.map((e) => {
          const exercise = exercises.get(e.exerciseId);
          const barbell = exercise?.equipment === 'barbell';
          const helped = new Set<string>();
          return (
            <li key={e.id} className="rounded-md border border-rule p-3">
              <h4 className="text-base font-semibold">{session.exerciseNames[e.exerciseId] ?? exercise?.name ?? 'Exercise'}</h4>
              {e.notes && <p className="text-sm text-ink-2">{e.notes}</p>}
              <ul className="mt-1 space-y-2">
                {e.sets.map((set, j) => {
                  const plannedKg = session.loadsKg[set.id] ?? null;
                  // A kg plan read in pounds: what goes on the bar, rounded down (as in My week and the log).
                  const loadKg = plannedKg === null || set.load.kind === unit ? plannedKg : plannedLoadOnTheBarKg(plannedKg, unit);
                  // One plate line per distinct load: identical sets do not repeat it.
                  const key = loadKg === null ? '' : loadKg.toFixed(3);
                  const showPlates = barbell && loadKg !== null && !helped.has(key);
                  if (showPlates) helped.add(key);
                  return (
                    <li key={set.id} className="text-base">
                      <p className="tabular-nums">
                        <span className="font-semibold">Set {j + 1}:</span> {setWords(set, loadKg, unit)}
                        {set.targetRpe != null && <span className="text-ink-2"> · RPE {set.targetRpe}</span>}
                        {set.restSeconds != null && <span className="text-ink-2"> · {restWords(set.restSeconds)}</span>}
                      </p>
                      {set.notes && <p className="text-sm text-ink-2">{set.notes}</p>}
                      {showPlates && <PlateHelper loadKg={loadKg} unit={unit} />}
                    </li>
                  );
                })}
              </ul>
            </li>
          );
        })}
      </ol>
      <p className="mt-3 text-sm text-ink-2">Stop and tell your clinician if pain rises past the ceiling they set.</p>
    </article>
  );
}
