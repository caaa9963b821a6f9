import { Link } from 'react-router-dom';
import type { CaseDto } from '../../../../../policies/dto';
import { StatusMark } from '../../../components/ui/StatusMark';
import { orgDayOf } from '../../../lib/dates';
import { formatDate } from '../../../lib/format';
import { regionsText } from './case-words';

/** A short table of one athlete's cases. Columns the reader's role does not receive are left out. */
export function CaseList({
  cases,
  caption,
  empty,
  caseHref,
}: {
  cases: CaseDto[];
  caption: string;
  empty: string;
  caseHref: (caseId: string) => string;
}) {
  if (cases.length === 0) return <p className="text-sm text-ink-2">{empty}</p>;
  const showDiagnosis = cases.some((c) => 'diagnosis' in c);
  const closed = cases.some((c) => c.closedOn);
  return (
    <div role="region" aria-label={caption} tabIndex={0} className="overflow-x-auto rounded-md border border-rule">
      <table className="w-full min-w-[40rem] border-collapse text-left text-sm">
        <caption className="sr-only">{caption}</caption>
        <thead>
          <tr className="border-b border-rule bg-shade">
            <th scope="col" className="px-3 py-2">
              Case
            </th>
            {showDiagnosis && (
              <th scope="col" className="px-3 py-2">
                Working diagnosis
              </th>
            )}
            <th scope="col" className="px-3 py-2">
              Onset
            </th>
            <th scope="col" className="px-3 py-2">
              {closed ? 'Last status' : 'Status'}
            </th>
            <th scope="col" className="px-3 py-2">
              {closed ? 'Closed' : 'Review'}
            </th>
            <th scope="col" className="px-3 py-2">
              Plan
            </th>
          </tr>
        </thead>
        <tbody>
          {cases.map((c) => (
            <tr key={c.id} className="border-b border-rule align-top last:border-b-0">
              <td className="px-3 py-2">
                <Link to={caseHref(c.id)} className="font-semibold">
                  {regionsText(c.bodyRegions)}
                </Link>
                <span className="block text-xs text-muted">
                  opened {formatDate(orgDayOf(c.openedAt))}
                  {c.openedByName && ` by ${c.openedByName}`}
                </span>
              </td>
              {showDiagnosis && <td className="px-3 py-2">{c.diagnosis || <span className="text-muted">—</span>}</td>}
              <td className="px-3 py-2 whitespace-nowrap tabular-nums">{formatDate(c.onsetDate)}</td>
              <td className="px-3 py-2">
                <StatusMark status={c.status} />
                <span className="block text-xs text-muted tabular-nums">from {formatDate(c.statusEffectiveFrom)}</span>
              </td>
              <td className="px-3 py-2 whitespace-nowrap tabular-nums">
                {c.closedOn ? (
                  formatDate(c.closedOn)
                ) : c.reviewDate ? (
                  formatDate(c.reviewDate)
                ) : (
                  <span className="text-muted">none set</span>
                )}
              </td>
              <td className="px-3 py-2">{c.planId ? 'Written' : <span className="text-muted">Not yet</span>}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
