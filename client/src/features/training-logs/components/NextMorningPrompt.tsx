import { useId, useState, type ReactNode } from 'react';
import type { TrainingLogDto, TrainingLogOutcomeDto } from '../../../../../policies/dto';
import { addDaysIso, todayLocal } from '../../../lib/dates';
import { formatDate } from '../../../lib/format';
import { ErrorNotice } from '../../../components/ui/Notice';
import { cx } from '../../../components/ui/cx';
import { useTrainingLogs } from '../api/get-training-logs';
import { useRecordNextMorning } from '../api/record-next-morning';
import { useRecordPainAfter } from '../api/record-pain-after';
import { PainRuleMessage } from './PainRuleMessage';

const SCORES = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10] as const;

const newestFirst = (a: TrainingLogDto, b: TrainingLogDto) => (a.date < b.date ? 1 : a.date > b.date ? -1 : 0);

/**
 * Yesterday's latest session still waiting for its next-morning pain, if any. "Next morning" is the
 * next calendar day in the organization's zone: a session logged today is not asked about until
 * tomorrow (the server refuses it earlier too).
 */
export function pendingNextMorning(logs: readonly TrainingLogDto[], today: string): TrainingLogDto | null {
  const yesterday = addDaysIso(today, -1);
  return [...logs].filter((l) => l.painNextMorning === null && l.date === yesterday).sort(newestFirst)[0] ?? null;
}

/** Today's latest session still waiting for its pain after the session (this evening), if any. */
export function pendingEvening(logs: readonly TrainingLogDto[], today: string): TrainingLogDto | null {
  return logs.find((l) => l.painAfter === null && l.date === today) ?? null;
}

/** One question, eleven large buttons: 0 is no pain, 10 the worst you can imagine. */
function OneTapScore({
  heading,
  intro,
  label,
  busy,
  chosen,
  error,
  onPick,
}: {
  heading: string;
  intro: ReactNode;
  label: (n: number) => string;
  busy: boolean;
  chosen: number | undefined;
  error: unknown;
  onPick: (n: number) => void;
}) {
  const headingId = useId();
  return (
    <section aria-labelledby={headingId} className="rounded-lg border-2 border-ink bg-sheet p-4 sm:p-5">
      <h2 id={headingId} className="text-lg font-bold">
        {heading}
      </h2>
      <p className="text-sm text-ink-2">{intro}</p>
      <div role="group" aria-labelledby={headingId} className="mt-3 grid grid-cols-6 gap-1.5 sm:grid-cols-11">
        {SCORES.map((n) => (
          <button
            key={n}
            type="button"
            aria-label={label(n)}
            disabled={busy}
            onClick={() => onPick(n)}
            className={cx(
              'min-h-12 rounded-md border text-lg font-semibold tabular-nums',
              'disabled:cursor-wait disabled:opacity-60',
              // One fill per state: a hover fill beside the chosen one used to win (light text on a light fill).
              busy && chosen === n ? 'border-ink bg-ink text-paper' : 'border-rule-strong bg-sheet hover:bg-shade',
            )}
          >
            {n}
          </button>
        ))}
      </div>
      <ErrorNotice error={error} className="mt-3" />
    </section>
  );
}

function Answered({ title, outcome }: { title: string; outcome: TrainingLogOutcomeDto }) {
  const headingId = useId();
  return (
    <section aria-labelledby={headingId} className="space-y-2 rounded-lg border border-rule bg-sheet p-4 sm:p-5">
      <h2 id={headingId} className="text-lg font-bold">
        {title}
      </h2>
      <PainRuleMessage painRule={outcome.painRule} />
    </section>
  );
}

/**
 * The follow-up pain questions on the athlete's home, one tap each: "after your session, this
 * evening" for a session logged today without it, and "this morning" for yesterday's session. They
 * show only when a session is waiting for the answer, and stay out of the way when logs can't be read.
 */
export function NextMorningPrompt({ orgId, athleteId }: { orgId: string; athleteId: string }) {
  const today = todayLocal();
  const logs = useTrainingLogs(orgId, athleteId, { from: addDaysIso(today, -1), to: today });
  const morning = useRecordNextMorning(orgId);
  const evening = useRecordPainAfter(orgId);
  const [answeredMorning, setAnsweredMorning] = useState<TrainingLogOutcomeDto | null>(null);
  const [answeredEvening, setAnsweredEvening] = useState<TrainingLogOutcomeDto | null>(null);

  const morningLog = logs.data ? pendingNextMorning(logs.data, today) : null;
  const eveningLog = logs.data ? pendingEvening(logs.data, today) : null;
  return (
    <>
      {answeredMorning ? (
        <Answered title={`Thanks — pain this morning: ${answeredMorning.log.painNextMorning}/10`} outcome={answeredMorning} />
      ) : (
        morningLog && (
          <OneTapScore
            heading="How is the pain this morning?"
            intro={
              <>
                After your session on {formatDate(morningLog.date)} (pain before {morningLog.painBefore}/10, during {morningLog.painDuring}
                /10
                {morningLog.painAfter !== null && <>, that evening {morningLog.painAfter}/10</>}). One tap: 0 is no pain, 10 the worst you
                can imagine.
              </>
            }
            label={(n) => `Pain this morning ${n}`}
            busy={morning.isPending}
            chosen={morning.variables?.painNextMorning}
            error={morning.error}
            onPick={(n) =>
              morning.mutate({ logId: morningLog.id, painNextMorning: n, version: morningLog.version }, { onSuccess: setAnsweredMorning })
            }
          />
        )
      )}
      {answeredEvening ? (
        <Answered title={`Thanks — pain after your session: ${answeredEvening.log.painAfter}/10`} outcome={answeredEvening} />
      ) : (
        eveningLog && (
          <OneTapScore
            heading="How is the pain now, after your session?"
            intro={
              <>
                Your session today (pain during {eveningLog.painDuring}/10). Best answered this evening; tomorrow morning you will be asked
                how it is then. One tap: 0 is no pain, 10 the worst you can imagine.
              </>
            }
            label={(n) => `Pain after the session ${n}`}
            busy={evening.isPending}
            chosen={evening.variables?.painAfter}
            error={evening.error}
            onPick={(n) =>
              evening.mutate({ logId: eveningLog.id, painAfter: n, version: eveningLog.version }, { onSuccess: setAnsweredEvening })
            }
          />
        )
      )}
    </>
  );
}
