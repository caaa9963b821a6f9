import type { ExceptionDto } from '../../../../../policies/dto';
import { formatDate, formatDateTime } from '../../../lib/format';

/** Past decisions, newest first: who decided, what, and the note they left. */
export function ExceptionHistory({ requests }: { requests: ExceptionDto[] }) {
  if (requests.length === 0) return <p className="text-sm text-ink-2">No decision yet.</p>;
  return (
    <div role="region" aria-label="Decided requests" tabIndex={0} className="overflow-x-auto rounded-lg border border-rule bg-sheet">
      <table className="w-full min-w-[52rem] text-left text-sm">
        <thead>
          <tr className="border-b border-rule bg-shade">
            <th scope="col" className="px-3 py-2 font-semibold">
              Decided
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              Athlete
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              Session
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              Decision
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              Note
            </th>
          </tr>
        </thead>
        <tbody>
          {requests.map((x) => (
            <tr key={x.id} className="border-b border-rule align-top last:border-b-0">
              <td className="px-3 py-2 whitespace-nowrap tabular-nums">
                {formatDateTime(x.decidedAt)}
                <span className="block text-xs text-muted">{x.decidedByName ?? '—'}</span>
              </td>
              <td className="px-3 py-2">{x.athleteName}</td>
              <td className="px-3 py-2">
                <span className="tabular-nums">{formatDate(x.sessionDate)}</span> · {x.sessionTitle}
                <span className="block text-xs text-muted">
                  Asked by {x.requestedByName ?? 'a coach'}: “{x.reason}”
                </span>
              </td>
              <td className="px-3 py-2 whitespace-nowrap font-semibold">
                {x.status === 'granted' ? `Granted ${x.grantedSetIds.length} of ${x.setIds.length} sets` : 'Refused'}
              </td>
              <td className="px-3 py-2">{x.decisionNote}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
