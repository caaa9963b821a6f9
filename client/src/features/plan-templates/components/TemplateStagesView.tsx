import type { Unit } from '../../../../../policies/schemas';
import type { TemplateStage } from '../../../../../policies/load/plan-template';
import { MOVEMENT_PATTERNS, PATTERN_LABELS } from '../../../../../policies/load/patterns';
import { plainCriterion } from '../../../../../policies/plain-words';
import { capsShort, patternList } from '../../plans/components/plan-words';

const dayRange = (a: number, b: number) => (a === b ? `Day ${a + 1}` : `Days ${a + 1}–${b + 1}`);

/** A template's stages: days from the plan's first day (day 1), limits, pain ceiling and exit criteria. */
export function TemplateStagesView({ stages, unit }: { stages: TemplateStage[]; unit: Unit }) {
  if (stages.length === 0) return <p className="text-sm text-muted">No stages.</p>;
  return (
    <ol className="space-y-3">
      {stages.map((stage, i) => {
        const limited = MOVEMENT_PATTERNS.filter((p) => (stage.patterns[p]?.mode ?? 'free') !== 'free');
        const free = MOVEMENT_PATTERNS.filter((p) => !limited.includes(p));
        const number = i + 1;
        return (
          <li key={number} className="rounded-md border border-rule p-3">
            <h3 className="font-bold">
              Stage {number}
              {stage.label && <span className="font-normal"> · {stage.label}</span>}
            </h3>
            <p className="mt-0.5 text-sm text-ink-2 tabular-nums">
              {dayRange(stage.startOffset, stage.endOffset)} ({stage.endOffset - stage.startOffset + 1} days)
              {typeof stage.reviewOffset === 'number' && <> · review on day {stage.reviewOffset + 1}</>} · pain ceiling {stage.painCeiling}
              /10
            </p>
            {limited.length > 0 && (
              <table className="mt-2 w-full border-collapse text-left text-sm">
                <caption className="sr-only">Limits in stage {number}</caption>
                <thead className="sr-only">
                  <tr>
                    <th scope="col">Pattern</th>
                    <th scope="col">Rule</th>
                  </tr>
                </thead>
                <tbody>
                  {limited.map((p) => {
                    const rule = stage.patterns[p]!;
                    return (
                      <tr key={p} className="border-t border-rule align-top">
                        <th scope="row" className="w-32 py-1 pr-3 font-semibold sm:w-44">
                          {PATTERN_LABELS[p]}
                        </th>
                        <td className="py-1 tabular-nums">
                          {rule.mode === 'blocked' ? <span className="font-semibold">Blocked</span> : capsShort(rule.caps, unit)}
                        </td>
                      </tr>
                    );
                  })}
                </tbody>
              </table>
            )}
            <p className="mt-1 text-sm text-muted">
              {limited.length === 0
                ? 'Every movement pattern is free in this stage.'
                : free.length > 0 && `No limits: ${patternList(free)}.`}
            </p>
            {stage.criteria && stage.criteria.length > 0 && (
              <div className="mt-2 text-sm">
                <p className="font-semibold">To move on from this stage</p>
                <ul className="list-disc pl-5">
                  {stage.criteria.map((c) => (
                    <li key={c.id}>{plainCriterion(c)}</li>
                  ))}
                </ul>
              </div>
            )}
          </li>
        );
      })}
    </ol>
  );
}
