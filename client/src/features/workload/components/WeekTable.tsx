import { useId } from 'react';
import type { WorkloadDto } from '../../../../../policies/dto';
import { CHRONIC_DAYS } from '../../../../../policies/load/workload';
import { formatDate } from '../../../lib/format';

const two = (n: number | null) => (n === null ? '—' : n.toFixed(2));
const whole = (n: number | null) => (n === null ? '—' : Math.round(n).toLocaleString('en'));

/** Weekly totals, monotony and strain (Foster 1998), with how they are worked out. */
export function WeekTable({ weeks }: { weeks: WorkloadDto['weeks'] }) {
  const id = useId();
  return (
    <section aria-labelledby={id} className="rounded-lg border border-rule bg-sheet p-4 sm:p-5">
      <h2 id={id} className="text-lg font-bold">
        Monotony and strain
      </h2>
      <p className="mt-1 max-w-prose text-sm text-ink-2">
        For each seven days: <strong>monotony</strong> is the mean daily load divided by its standard deviation, and <strong>strain</strong>{' '}
        is the week&apos;s total load times its monotony (Foster 1998). We use the <strong>population SD</strong> (divide by 7: the seven
        days are the whole week, not a sample), with rest days counted as 0. A week where every day is the same has no monotony value (—).
      </p>
      {weeks.length === 0 ? (
        <p className="mt-3 text-sm text-ink-2">Not enough days for a full week yet.</p>
      ) : (
        <div
          role="region"
          aria-label="Monotony and strain by week"
          tabIndex={0}
          className="mt-3 overflow-x-auto rounded-md border border-rule"
        >
          <table className="w-full min-w-[28rem] border-collapse text-left text-sm tabular-nums">
            <thead>
              <tr className="border-b border-rule bg-shade">
                <th scope="col" className="px-3 py-2 font-semibold">
                  Week
                </th>
                <th scope="col" className="px-3 py-2 text-right font-semibold">
                  Total load (AU)
                </th>
                <th scope="col" className="px-3 py-2 text-right font-semibold">
                  Monotony
                </th>
                <th scope="col" className="px-3 py-2 text-right font-semibold">
                  Strain
                </th>
              </tr>
            </thead>
            <tbody>
              {[...weeks].reverse().map((w) => (
                <tr key={w.start} className="border-b border-rule last:border-b-0">
                  <th scope="row" className="px-3 py-2 font-normal whitespace-nowrap">
                    {formatDate(w.start)} – {formatDate(w.end)}
                  </th>
                  <td className="px-3 py-2 text-right">{whole(w.total)}</td>
                  <td className="px-3 py-2 text-right">{two(w.monotony)}</td>
                  <td className="px-3 py-2 text-right">{whole(w.strain)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}

/**
 * The last 7 days against the last 28, as a sentence. Hidden until there are 28 days of logs, and
 * never called a risk: the ratio is a description of change, nothing more.
 */
export function AcuteChronicNote({ acuteChronic }: { acuteChronic: WorkloadDto['acuteChronic'] }) {
  const id = useId();
  const ready = acuteChronic.daysOfData >= CHRONIC_DAYS && acuteChronic.ratio !== null;
  return (
    <section aria-labelledby={id} className="rounded-lg border border-rule bg-sheet p-4 sm:p-5">
      <h2 id={id} className="text-lg font-bold">
        This week against the recent average
      </h2>
      {ready ? (
        <>
          <p className="mt-2 text-base font-semibold">{acuteChronic.description}</p>
          <p className="mt-1 text-sm text-ink-2 tabular-nums">
            Last 7 days {Math.round(acuteChronic.acute)} AU a day, last 28 days {Math.round(acuteChronic.chronic)} AU a day (ratio{' '}
            {acuteChronic.ratio!.toFixed(2)}).
          </p>
        </>
      ) : (
        <p className="mt-2 text-base">
          Shown once there are {CHRONIC_DAYS} days of logs (so far {acuteChronic.daysOfData}). Before that, the comparison is misleading.
        </p>
      )}
      <p className="mt-2 max-w-prose text-sm text-muted">
        Exponentially weighted averages of daily load over 7 and 28 days (Williams et al. 2017), both started at the average of the first 28
        days (common practice), so a steady load reads 1.00 rather than a rise. This describes how much the load changed; it is{' '}
        <strong>not an injury-risk score</strong>. The ratio and the &ldquo;safe zone&rdquo; bands often quoted with it have been criticised
        as mathematically coupled and not predictive of injury (Impellizzeri et al. 2020, Sports Medicine).
      </p>
    </section>
  );
}
