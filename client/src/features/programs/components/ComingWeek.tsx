import type { AthleteWeekDto } from '../../../../../policies/dto';
import type { Unit } from '../../../../../policies/schemas';
import { ButtonLink } from '../../../components/ui/Button';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Loading } from '../../../components/ui/Panel';
import { StatusMark } from '../../../components/ui/StatusMark';
import { formatDate } from '../../../lib/format';
import { useWeek } from '../api/get-week';
import { setLines } from './week-set-lines';

type Day = AthleteWeekDto['days'][number];

/**
 * "My week" looking ahead: the seven days from the organization's today, each with what is planned
 * and what the athlete may and may not do that day, in their words (load caps as a load they can put
 * on the bar). A session on hold shows no loads and cannot be logged from.
 */
export function ComingWeek({
  orgId,
  athleteId,
  today,
  logHref,
  loggedSessionIds,
}: {
  orgId: string;
  athleteId: string;
  today: string;
  logHref: (sessionId: string, date: string) => string;
  loggedSessionIds: ReadonlySet<string>;
}) {
  const week = useWeek(orgId, athleteId, today);
  if (week.isPending) return <Loading what="your coming week" />;
  // Kept answers from an earlier visit are shown even when refreshing them fails (lib/offline-copy.ts).
  if (week.isError && !week.data) return <ErrorNotice error={week.error} title="Your coming week is not available" />;
  return (
    <section aria-labelledby="coming-week-heading" className="space-y-3">
      <h2 id="coming-week-heading" className="text-xl font-bold">
        The coming week
      </h2>
      <p className="text-sm text-ink-2">
        {formatDate(week.data.from)} to {formatDate(week.data.to)}: what is planned, and what you may do each day. Loads are what you can
        put on the bar, rounded down.
      </p>
      <ol className="space-y-3">
        {week.data.days.map((d, i) => (
          <OneDay
            key={d.date}
            day={d}
            sameLimitsAsDayBefore={i > 0 && sameLimits(week.data.days[i - 1], d)}
            isToday={d.date === today}
            unit={week.data.unit}
            logHref={logHref}
            loggedSessionIds={loggedSessionIds}
          />
        ))}
      </ol>
    </section>
  );
}

/** Two days with the same status and the same limits in words: the later one need not say them all again. */
function sameLimits(a: Day, b: Day): boolean {
  return a.status === b.status && JSON.stringify(a.limits) === JSON.stringify(b.limits);
}

function OneDay({
  day,
  sameLimitsAsDayBefore,
  isToday,
  unit,
  logHref,
  loggedSessionIds,
}: {
  day: Day;
  sameLimitsAsDayBefore: boolean;
  isToday: boolean;
  unit: Unit;
  logHref: (sessionId: string, date: string) => string;
  loggedSessionIds: ReadonlySet<string>;
}) {
  const title = `${isToday ? 'Today, ' : ''}${formatDate(day.date)}`;
  const { limits } = day;
  return (
    <li aria-label={title} className="rounded-lg border border-rule bg-sheet p-4">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="text-base font-bold">{title}</h3>
        <StatusMark status={day.status} />
      </div>
      <div className="mt-2 space-y-1 text-base">
        <p className="font-semibold">{limits.headline}</p>
        {sameLimitsAsDayBefore ? <p className="text-sm text-ink-2">The same limits as the day before.</p> : <LimitLists limits={limits} />}
        {!isToday && day.stages.some((st) => st.startDate === day.date) && (
          <p className="rounded-md bg-shade px-3 py-2 text-sm">
            A new stage of your plan starts on this day, as planned. Your clinician may keep you at the stage before for longer: if they
            have not talked it through with you yet, ask them before you do more.
          </p>
        )}
      </div>
      <div className="mt-3 space-y-3">
        {day.sessions.length === 0 ? (
          <p className="text-sm text-ink-2">Nothing planned.</p>
        ) : (
          day.sessions.map((s) => (
            <article key={s.id} aria-label={s.title} className="rounded-md border border-rule p-3">
              <h4 className="font-semibold">{s.title}</h4>
              {s.onHold ? (
                <Notice tone="caution" title="On hold until your coach updates it" className="mt-2">
                  <p>Your limits changed after this session was written. Don&apos;t do it yet: your coach has been told.</p>
                </Notice>
              ) : (
                <>
                  <ul className="mt-1 space-y-1 text-sm">
                    {s.content.exercises.map((e) => (
                      <li key={e.id}>
                        <span className="font-semibold">{s.exerciseNames[e.exerciseId] ?? 'Exercise'}</span>:{' '}
                        {setLines(s, e, unit).join('; ')}
                      </li>
                    ))}
                  </ul>
                  {loggedSessionIds.has(s.id) ? (
                    <p className="mt-2 text-sm font-semibold">Logged.</p>
                  ) : (
                    // A session is logged once done: from its day on, never ahead of it.
                    isToday && (
                      <ButtonLink to={logHref(s.id, day.date)} size="md" className="mt-2" aria-label={`Log this session: ${s.title}`}>
                        Log this session
                      </ButtonLink>
                    )
                  )}
                </>
              )}
            </article>
          ))
        )}
      </div>
    </li>
  );
}

/** What may not be done, what may within limits, what is free, and the pain limit, as lists. */
function LimitLists({ limits }: { limits: Day['limits'] }) {
  return (
    <>
      {limits.mayNot.length > 0 && (
        <div>
          <p>Not allowed:</p>
          <ul className="ml-5 list-disc">
            {limits.mayNot.map((m) => (
              <li key={m}>{m}</li>
            ))}
          </ul>
        </div>
      )}
      {limits.withLimits.length > 0 && (
        <div>
          <p>Allowed within limits:</p>
          <ul className="ml-5 list-disc">
            {limits.withLimits.map((m) => (
              <li key={m}>{m}</li>
            ))}
          </ul>
        </div>
      )}
      {limits.free && <p className="text-sm text-ink-2">{limits.free}</p>}
      {limits.pain && <p className="text-sm font-semibold">{limits.pain}</p>}
    </>
  );
}
