import type { CheckInDto } from '../../../../../policies/dto';
import { formatDate } from '../../../lib/format';

/** Recent check-ins as a small table; it scrolls sideways inside itself on a narrow phone. */
export function CheckInList({ checkIns, empty }: { checkIns: readonly CheckInDto[]; empty: string }) {
  if (checkIns.length === 0) return <p className="text-sm text-ink-2">{empty}</p>;
  return (
    <div role="region" aria-label="Check-ins" tabIndex={0} className="overflow-x-auto rounded-lg border border-rule bg-sheet">
      <table className="w-full border-collapse text-left text-sm tabular-nums">
        <thead>
          <tr className="border-b border-rule bg-shade">
            <th scope="col" className="px-3 py-2 font-semibold">
              Date
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              Sleep
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              Soreness
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              Ready
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              Pain
            </th>
          </tr>
        </thead>
        <tbody>
          {checkIns.map((c) => (
            <tr key={c.id} className="border-b border-rule last:border-b-0">
              <th scope="row" className="px-3 py-2 font-normal whitespace-nowrap">
                {formatDate(c.date)}
              </th>
              <td className="px-3 py-2 whitespace-nowrap">{c.sleepHours} h</td>
              <td className="px-3 py-2">{c.soreness}/10</td>
              <td className="px-3 py-2">{c.readiness}/10</td>
              <td className="px-3 py-2">{c.painNow}/10</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
