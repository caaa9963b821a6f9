import type { ReactNode } from 'react';
import type { TrainingLogDto } from '../../../../../policies/dto';
import type { Unit } from '../../../../../policies/schemas';
import { formatDate } from '../../../lib/format';
import { LineBar } from '../../../components/ui/LineBar';
import { effortWords } from './effort-words';
import { setsOf } from '../../../../../policies/words/loads';

/** "Back squat: 3 sets of 60 kg × 5" (policies/words/loads.ts): identical consecutive sets are folded into one line. */
export function setsSummary(sets: TrainingLogDto['sets'], unit: Unit): string[] {
  const lines: { exercise: string; loadKg: number; reps: number; count: number }[] = [];
  for (const s of sets) {
    const last = lines.at(-1);
    if (last && last.exercise === s.exercise && last.loadKg === s.loadKg && last.reps === s.reps) last.count += 1;
    else lines.push({ exercise: s.exercise, loadKg: s.loadKg, reps: s.reps, count: 1 });
  }
  return lines.map((l) => `${l.exercise}: ${setsOf(l.count, l.loadKg, unit, l.reps)}`);
}

/**
 * The athlete's sessions, newest first, each with its pain drawn against the clinician's ceiling
 * (the product's line), so a breach is the bar crossing it, plus words.
 */
export function LogList({
  logs,
  unit,
  empty,
  actions,
}: {
  logs: readonly TrainingLogDto[];
  unit: Unit;
  empty: string;
  /** Links under each session, e.g. the page that adds a clip to it. */
  actions?: (log: TrainingLogDto) => ReactNode;
}) {
  if (logs.length === 0) return <p className="text-sm text-ink-2">{empty}</p>;
  return (
    <ol className="space-y-3">
      {logs.map((log) => (
        <li key={log.id} className="rounded-lg border border-rule bg-sheet p-4">
          <h3 className="font-bold tabular-nums">{formatDate(log.date)}</h3>
          <p className="text-sm text-ink-2 tabular-nums">
            {log.durationMinutes} min · effort {log.sessionRpe} ({effortWords(log.sessionRpe).toLowerCase()}) · load {log.sessionLoad}
          </p>
          <div className="mt-2 space-y-2">
            <LineBar
              label={`Pain during, ${formatDate(log.date)}`}
              value={log.painDuring}
              limit={log.painCeiling}
              max={10}
              format={String}
            />
            <p className="text-sm tabular-nums">
              Pain before {log.painBefore}/10 · that evening {log.painAfter === null ? 'not given' : `${log.painAfter}/10`} · next morning{' '}
              {log.painNextMorning === null ? 'not given yet' : `${log.painNextMorning}/10`}
              {log.painNextMorning !== null && log.painNextMorning > log.painBefore && (
                <span className="font-semibold text-line-deep"> — higher than before the session</span>
              )}
            </p>
          </div>
          {log.sets.length > 0 && (
            <ul className="mt-2 list-disc pl-5 text-sm">
              {setsSummary(log.sets, unit).map((line, i) => (
                <li key={i}>{line}</li>
              ))}
            </ul>
          )}
          {log.notes && <p className="mt-2 text-sm text-ink-2">“{log.notes}”</p>}
          {actions && <div className="mt-3 flex flex-wrap gap-2">{actions(log)}</div>}
        </li>
      ))}
    </ol>
  );
}
