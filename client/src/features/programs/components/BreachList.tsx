import type { ExerciseDto } from '../../../../../policies/dto';
import type { Breach, EngineExercise } from '../../../../../policies/load/compliance';
import { Button } from '../../../components/ui/Button';
import { fixFor } from './program-words';
import { breachHeadline } from '../../../../../policies/words/breach-words';

export interface SetBreach {
  athleteId: string;
  /** Said only in a group program, where breaches differ from athlete to athlete. */
  athleteName: string | null;
  breach: Breach;
}

/**
 * A set's breaches in the engine's (or server's) own words — the cap, the limit, the planned value
 * and what fits — each with its one-click fix: the load that fits (with fewer reps when no load fits
 * the planned ones), or an exercise that is allowed.
 * Deliberately not an alert: it updates on every keystroke.
 */
export function BreachList({
  items,
  exercise,
  swapsFor,
  onUseLoad,
  onSwap,
  reps,
  label = 'Over a limit',
}: {
  items: SetBreach[];
  exercise?: ExerciseDto;
  /** The set's planned reps, for the headline "Back squat 120 kg × 5 is over …". */
  reps?: number;
  swapsFor?: (item: SetBreach) => EngineExercise[];
  /** Applies a fix: the load, and the reps when the fix is to cut them. */
  onUseLoad?: (value: number, unit: 'kg' | 'lb', reps?: number) => void;
  onSwap?: (exerciseId: string) => void;
  label?: string;
}) {
  if (items.length === 0) return null;
  return (
    <ul aria-label={label} className="mt-2 space-y-1.5">
      {items.map((item) => {
        const { breach } = item;
        const fix = breach.fittingKg !== null && !breach.waived ? fixFor(breach.fittingKg, exercise) : null;
        const headline = exercise ? breachHeadline(breach, exercise.name, reps) : null;
        const swaps = !breach.waived && (breach.rule === 'blocked' || breach.rule === 'impact') ? (swapsFor?.(item) ?? []) : [];
        return (
          <li
            key={`${item.athleteId}-${breach.rule}-${breach.pattern ?? ''}`}
            className={
              breach.waived
                ? 'rounded-md border border-dashed border-rule-strong px-2.5 py-1.5 text-sm text-ink-2'
                : 'rounded-md border-l-4 border-line-deep bg-paper px-2.5 py-1.5 text-sm'
            }
          >
            <p className="flex gap-1.5">
              <span aria-hidden="true" className={breach.waived ? 'text-muted' : 'text-line-deep'}>
                {breach.waived ? '◇' : '▲'}
              </span>
              <span className="tabular-nums">
                {item.athleteName && <span className="font-semibold">{item.athleteName}: </span>}
                {headline && <span className="block font-semibold">{headline}</span>}
                {breach.message}
                {breach.waived && <span className="font-semibold"> Covered by a granted exception.</span>}
              </span>
            </p>
            {(fix || swaps.length > 0) && (
              <div className="mt-1 flex flex-wrap gap-2 pl-5">
                {fix && onUseLoad && (
                  <Button size="sm" variant="secondary" onClick={() => onUseLoad(fix.value, fix.unit, breach.fittingReps)}>
                    {breach.fittingReps !== undefined
                      ? `Use ${breach.fittingReps} reps at ${fix.value} ${fix.unit}`
                      : `Use ${fix.value} ${fix.unit}`}
                  </Button>
                )}
                {onSwap &&
                  swaps.map((s) => (
                    <Button key={s.id} size="sm" variant="secondary" onClick={() => onSwap(s.id)}>
                      Swap to {s.name}
                    </Button>
                  ))}
              </div>
            )}
          </li>
        );
      })}
    </ul>
  );
}
