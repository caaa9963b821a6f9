import { useState } from 'react';
import type { BaselineDto, ExerciseDto } from '../../../../../policies/dto';
import { formatLoad } from '../../../../../policies/load/units';
import type { Unit } from '../../../../../policies/schemas';
import { Button } from '../../../components/ui/Button';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Badge, Loading } from '../../../components/ui/Panel';
import { formatDate } from '../../../lib/format';
import { currentOneRms, useBaselines } from '../api/baselines';
import { useLibrary } from '../api/get-library';
import { BaselineForm } from './BaselineForm';
import { loadTimesReps } from '../../../../../policies/words/loads';

/** How a 1RM came about, in words: "tested", "100 kg × 5 at RPE 8". */
export function baselineSource(b: BaselineDto, unit: Unit): string {
  if (b.kind === 'tested') return 'tested single';
  const set = `${loadTimesReps(b.loadKg, unit, b.reps)}${b.rpe !== null ? ` at RPE ${b.rpe}` : ''}`;
  return b.kind === 'logged' ? `logged ${set}` : `estimated from ${set}`;
}

/**
 * Each lift's current 1RM — the number every %-of-1RM cap is worked out from — and a form to record
 * a tested max or a set to estimate it from.
 */
export function BaselinesPanel({
  orgId,
  athleteId,
  unit,
  canRecord,
}: {
  orgId: string;
  athleteId: string;
  unit: Unit;
  canRecord: boolean;
}) {
  const baselines = useBaselines(orgId, athleteId);
  const library = useLibrary(orgId);
  const [adding, setAdding] = useState(false);
  const [saved, setSaved] = useState<string | null>(null);

  if (baselines.isPending) return <Loading what="baselines" />;
  if (baselines.isError) return <ErrorNotice error={baselines.error} />;
  const current = Object.values(currentOneRms(baselines.data)).sort((a, b) => a.exerciseName.localeCompare(b.exerciseName));

  return (
    <div className="space-y-3">
      {current.length === 0 ? (
        <p className="text-sm text-ink-2">No 1RM on record yet. Caps given as a % of 1RM need one for each lift.</p>
      ) : (
        <div role="region" aria-label="Current 1RM per lift" tabIndex={0} className="overflow-x-auto rounded-md border border-rule">
          <table className="w-full min-w-[34rem] text-left text-sm">
            <thead>
              <tr className="border-b border-rule bg-shade">
                <th scope="col" className="px-3 py-1.5 font-semibold">
                  Lift
                </th>
                <th scope="col" className="px-3 py-1.5 font-semibold">
                  1RM
                </th>
                <th scope="col" className="px-3 py-1.5 font-semibold">
                  From
                </th>
                <th scope="col" className="px-3 py-1.5 font-semibold">
                  Date
                </th>
              </tr>
            </thead>
            <tbody>
              {current.map((b) => (
                <tr key={b.exerciseId} className="border-b border-rule last:border-b-0">
                  <td className="px-3 py-1.5 font-semibold">{b.exerciseName}</td>
                  <td className="px-3 py-1.5 whitespace-nowrap tabular-nums">
                    {b.kind === 'estimated' && <span className="text-muted">≈ </span>}
                    {formatLoad(b.e1rmKg, unit)}
                    {b.lowReliability && (
                      <>
                        {' '}
                        <Badge tone="warn">Low reliability</Badge>
                      </>
                    )}
                  </td>
                  <td className="px-3 py-1.5 text-ink-2">
                    {baselineSource(b, unit)}
                    {b.lowReliability && (
                      <span className="block text-xs">From more than 10 reps: estimates this far out are much less reliable.</span>
                    )}
                  </td>
                  <td className="px-3 py-1.5 whitespace-nowrap tabular-nums">{formatDate(b.testedOn)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {baselines.data.length > current.length && (
        <details className="text-sm">
          <summary className="cursor-pointer font-semibold">Earlier entries ({baselines.data.length - current.length})</summary>
          <ul className="mt-1 space-y-0.5 tabular-nums">
            {baselines.data
              .filter((b) => !current.includes(b))
              .map((b) => (
                <li key={b.id}>
                  {formatDate(b.testedOn)} · {b.exerciseName}: {formatLoad(b.e1rmKg, unit)}{' '}
                  <span className="text-ink-2">({baselineSource(b, unit)})</span>
                </li>
              ))}
          </ul>
        </details>
      )}
      {saved && (
        <p role="status" className="text-sm font-semibold">
          {saved}
        </p>
      )}
      {canRecord &&
        (adding && library.data ? (
          <BaselineForm
            orgId={orgId}
            athleteId={athleteId}
            unit={unit}
            library={library.data.filter((e: ExerciseDto) => !e.archived)}
            onCancel={() => setAdding(false)}
            onSaved={(b) => {
              setAdding(false);
              setSaved(`Saved: ${b.exerciseName} 1RM ${formatLoad(b.e1rmKg, unit)}. Published sessions are checked again against it.`);
            }}
          />
        ) : (
          <Button variant="secondary" onClick={() => setAdding(true)} busy={adding && library.isPending}>
            Record a 1RM or a set
          </Button>
        ))}
      {library.isError && <ErrorNotice error={library.error} />}
    </div>
  );
}
