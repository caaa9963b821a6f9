import { useId, useState } from 'react';
import type { TrainingLogDto, TrainingLogOutcomeDto } from '../../../../../policies/dto';
import { addDaysIso, todayLocal } from '../../../lib/dates';
import { formatDate } from '../../../lib/format';
import { ErrorNotice } from '../../../components/ui/Notice';
import { cx } from '../../../components/ui/cx';
import { useTrainingLogs } from '../api/get-training-logs';
import { useRecordNextMorning } from '../api/record-next-morning';
import { PainRuleMessage } from './PainRuleMessage';

const SCORES = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10] as const;

/** The latest session of yesterday or today still waiting for its next-morning pain, if any. */
export function pendingNextMorning(logs: readonly TrainingLogDto[], today: string): TrainingLogDto | null {
  const yesterday = addDaysIso(today, -1);
  return (
    [...logs]
      .filter((l) => l.painNextMorning === null && l.date >= yesterday && l.date <= today)
      .sort((a, b) => (a.date < b.date ? 1 : a.date > b.date ? -1 : 0))[0] ?? null
  );
}

/**
 * "How is the pain this morning?" as one tap on the athlete's home. It shows only when a recent
 * session is waiting for the answer, and it stays out of the way when the logs can't be read.
 */
export function NextMorningPrompt({ orgId, athleteId }: { orgId: string; athleteId: string }) {
  const today = todayLocal();
  const logs = useTrainingLogs(orgId, athleteId, { from: addDaysIso(today, -1), to: today });
  const record = useRecordNextMorning(orgId);
  const [answered, setAnswered] = useState<TrainingLogOutcomeDto | null>(null);
  const headingId = useId();

  if (answered) {
    return (
      <section aria-labelledby={headingId} className="space-y-2 rounded-lg border border-rule bg-sheet p-4 sm:p-5">
        <h2 id={headingId} className="text-lg font-bold">
          Thanks — pain this morning: {answered.log.painNextMorning}/10
        </h2>
        <PainRuleMessage painRule={answered.painRule} />
      </section>
    );
  }
  const log = logs.data ? pendingNextMorning(logs.data, today) : null;
  if (!log) return null;

  return (
    <section aria-labelledby={headingId} className="rounded-lg border-2 border-ink bg-sheet p-4 sm:p-5">
      <h2 id={headingId} className="text-lg font-bold">
        How is the pain this morning?
      </h2>
      <p className="text-sm text-ink-2">
        After your session {log.date === today ? 'today' : `on ${formatDate(log.date)}`} (pain before {log.painBefore}/10, during{' '}
        {log.painDuring}/10). One tap: 0 is no pain, 10 the worst you can imagine.
      </p>
      <div role="group" aria-labelledby={headingId} className="mt-3 grid grid-cols-6 gap-1.5 sm:grid-cols-11">
        {SCORES.map((n) => (
          <button
            key={n}
            type="button"
            aria-label={`Pain this morning ${n}`}
            disabled={record.isPending}
            onClick={() =>
              record.mutate({ logId: log.id, painNextMorning: n, version: log.version }, { onSuccess: (result) => setAnswered(result) })
            }
            className={cx(
              'min-h-12 rounded-md border border-rule-strong bg-sheet text-lg font-semibold tabular-nums hover:bg-shade',
              'disabled:cursor-wait disabled:opacity-60',
              record.isPending && record.variables?.painNextMorning === n && 'border-ink bg-ink text-paper',
            )}
          >
            {n}
          </button>
        ))}
      </div>
      <ErrorNotice error={record.error} className="mt-3" />
    </section>
  );
}
