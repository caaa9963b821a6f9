import type { Unit } from '../../../../../policies/schemas';
import type { PlanStage } from '../../../../../policies/load/in-force';
import { MOVEMENT_PATTERNS, PATTERN_LABELS, type MovementPattern } from '../../../../../policies/load/patterns';
import { Badge } from '../../../components/ui/Panel';
import { formatDate } from '../../../lib/format';
import { capsShort, dateRange, daysInclusive, patternList } from './plan-words';

function when(stage: PlanStage, today: string): { words: string; current: boolean } {
  if (stage.startDate <= today && today <= stage.endDate) return { words: 'In force today', current: true };
  if (stage.startDate > today) return { words: 'Upcoming', current: false };
  return { words: 'Ended', current: false };
}

/** A plan's stages as compact cards: dates, review, pain ceiling and every pattern that is not free. */
export function PlanStagesView({
  stages,
  unit,
  today,
  heading = 3,
  numbers,
}: {
  stages: PlanStage[];
  unit: Unit;
  today: string;
  heading?: 3 | 4;
  /** Each stage's number in its own plan, when showing a selection of stages. */
  numbers?: Map<string, number>;
}) {
  const H = heading === 3 ? 'h3' : 'h4';
  if (stages.length === 0) return <p className="text-sm text-muted">No stages.</p>;
  return (
    <ol className="space-y-3">
      {stages.map((stage, i) => {
        const state = when(stage, today);
        const limited = MOVEMENT_PATTERNS.filter((p) => (stage.patterns[p]?.mode ?? 'free') !== 'free');
        const free = MOVEMENT_PATTERNS.filter((p) => !limited.includes(p));
        const number = numbers?.get(stage.id) ?? i + 1;
        return (
          <li key={stage.id} className={`rounded-md border p-3 ${state.current ? 'border-ink border-l-4' : 'border-rule'}`}>
            <div className="flex flex-wrap items-baseline justify-between gap-2">
              <H className="font-bold">
                Stage {number}
                {stage.label && <span className="font-normal"> · {stage.label}</span>}
              </H>
              <Badge>{state.words}</Badge>
            </div>
            <p className="mt-0.5 text-sm text-ink-2 tabular-nums">
              {dateRange(stage.startDate, stage.endDate)} ({daysInclusive(stage.startDate, stage.endDate)} days)
              {stage.reviewDate && <> · review {formatDate(stage.reviewDate)}</>} · pain ceiling {stage.painCeiling}/10
            </p>
            {limited.length > 0 ? (
              <table className="mt-2 w-full border-collapse text-left text-sm">
                <caption className="sr-only">Limits in stage {number}</caption>
                <thead className="sr-only">
                  <tr>
                    <th scope="col">Pattern</th>
                    <th scope="col">Rule</th>
                  </tr>
                </thead>
                <tbody>
                  {limited.map((p) => (
                    <RuleRow key={p} pattern={p} stage={stage} unit={unit} />
                  ))}
                </tbody>
              </table>
            ) : null}
            {(limited.length === 0 || free.length > 0) && (
              <p className="mt-1 text-sm text-muted">
                {limited.length === 0 ? 'Every movement pattern is free in this stage.' : `No limits: ${patternList(free)}.`}
              </p>
            )}
          </li>
        );
      })}
    </ol>
  );
}

function RuleRow({ pattern, stage, unit }: { pattern: MovementPattern; stage: PlanStage; unit: Unit }) {
  const rule = stage.patterns[pattern]!;
  return (
    <tr className="border-t border-rule align-top">
      <th scope="row" className="w-32 py-1 pr-3 font-semibold sm:w-44">
        {PATTERN_LABELS[pattern]}
      </th>
      <td className="py-1 tabular-nums">
        {rule.mode === 'blocked' ? <span className="font-semibold">Blocked</span> : capsShort(rule.caps, unit)}
      </td>
    </tr>
  );
}
