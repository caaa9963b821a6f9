import type { StatusChangeDto } from '../../../../../policies/dto';
import { StatusMark } from '../../../components/ui/StatusMark';
import { formatDate, formatDateTime } from '../../../lib/format';
import { todayLocal } from '../../../lib/dates';

/** Every status the case has had, newest first, drawn down a thin rule. */
export function StatusTimeline({ history }: { history: StatusChangeDto[] }) {
  const today = todayLocal();
  if (history.length === 0) return <p className="text-sm text-muted">No status has been set yet.</p>;
  return (
    <ol aria-label="Status history" className="relative space-y-3 border-l-2 border-rule pl-4">
      {history.map((change) => (
        <li key={change.id} className="relative">
          <span aria-hidden="true" className="absolute top-2.5 -left-[1.3rem] h-0.5 w-3 bg-rule" />
          <div className="flex flex-wrap items-baseline gap-x-2">
            <StatusMark status={change.status} />
            <span className="text-sm tabular-nums">
              from {formatDate(change.effectiveFrom)}
              {change.effectiveFrom > today && <span className="text-muted"> (starts later)</span>}
            </span>
          </div>
          {change.note && <p className="mt-0.5 text-sm">“{change.note}”</p>}
          <p className="text-xs text-muted">
            Set {change.setByName ? `by ${change.setByName} ` : ''}on {formatDateTime(change.createdAt)}
          </p>
        </li>
      ))}
    </ol>
  );
}
