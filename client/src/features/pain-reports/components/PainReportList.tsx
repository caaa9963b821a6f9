import { Link } from 'react-router-dom';
import { BODY_REGION_LABELS } from '../../../../../policies/body-regions';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Loading, Panel } from '../../../components/ui/Panel';
import { SeverityMark } from '../../../components/ui/SeverityMark';
import { formatDateTime } from '../../../lib/format';
import { painReportHref } from '../../../lib/pain-report-href';
import { usePainReports } from '../api/get-pain-reports';

/** An athlete's pain reports, newest first, each a link to the whole report. */
export function PainReportList({ orgId, athleteId, athleteName }: { orgId: string; athleteId: string; athleteName: string }) {
  const reports = usePainReports(orgId, athleteId);
  return (
    <Panel title="Pain reports">
      {reports.isPending ? (
        <Loading what="pain reports" />
      ) : reports.isError ? (
        <ErrorNotice error={reports.error} />
      ) : reports.data.length === 0 ? (
        <p className="text-sm text-muted">{athleteName} has not reported pain yet.</p>
      ) : (
        <ol className="divide-y divide-rule border-y border-rule text-sm" aria-label={`Pain reports of ${athleteName}`}>
          {reports.data.map((r) => (
            <li key={r.id} className="flex flex-wrap items-center gap-x-4 gap-y-1 py-2">
              <Link to={painReportHref(r.id)} className="font-semibold whitespace-nowrap tabular-nums">
                {formatDateTime(r.reportedAt)}
              </Link>
              <span className="tabular-nums">
                {r.painNow}/10 now, {r.painWorst24h}/10 at worst
              </span>
              <span className="min-w-0 break-words">{r.bodyRegions.map((b) => BODY_REGION_LABELS[b] ?? b).join(', ')}</span>
              <SeverityMark severity={r.route} />
            </li>
          ))}
        </ol>
      )}
    </Panel>
  );
}
