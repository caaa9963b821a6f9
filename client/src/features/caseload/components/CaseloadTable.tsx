import { useId, useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import { createColumnHelper } from '@tanstack/react-table';
import type { CaseloadRowDto } from '../../../../../policies/dto';
import { PARTICIPATION_STATUSES, STATUS_LABELS, type ParticipationStatus } from '../../../../../policies/load/patterns';
import { DataTable } from '../../../components/ui/DataTable';
import { StatusMark } from '../../../components/ui/StatusMark';
import { Badge } from '../../../components/ui/Panel';
import { formatDate, formatDateTime } from '../../../lib/format';
import { painReportHref } from '../../../lib/pain-report-href';

const column = createColumnHelper<CaseloadRowDto>();

/** Out sorts first, then Limited: the athletes who need attention rise to the top. */
const STATUS_RANK: Record<ParticipationStatus, number> = { out: 0, limited: 1, full: 2 };

export interface CaseloadTableProps {
  rows: CaseloadRowDto[];
  caption: string;
  empty: string;
  athleteHref: (athleteId: string) => string;
  /** Clinicians see case counts and pain reports; coaches see the functional picture only. */
  clinical?: boolean;
}

export function CaseloadTable({ rows, caption, empty, athleteHref, clinical = false }: CaseloadTableProps) {
  const statusId = useId();
  const [status, setStatus] = useState<ParticipationStatus | 'any'>('any');
  const shown = status === 'any' ? rows : rows.filter((r) => r.status === status);

  const columns = useMemo(
    () => [
      column.accessor('athleteName', {
        header: 'Athlete',
        cell: (info) => (
          <span className="flex flex-wrap items-center gap-x-2 gap-y-1">
            <Link
              to={athleteHref(info.row.original.athleteId)}
              className="font-semibold whitespace-nowrap underline decoration-rule-strong underline-offset-4"
            >
              {info.getValue()}
            </Link>
            {info.row.original.isMinor && <Badge>Minor</Badge>}
          </span>
        ),
      }),
      column.accessor((r) => STATUS_RANK[r.status], {
        id: 'status',
        header: 'Status',
        cell: (info) => <StatusMark status={info.row.original.status} />,
      }),
      column.accessor('statusEffectiveFrom', {
        header: 'Since',
        sortUndefined: 'last',
        cell: (info) => <span className="whitespace-nowrap tabular-nums">{formatDate(info.getValue())}</span>,
      }),
      ...(clinical
        ? [
            column.accessor('openCaseCount', {
              header: 'Open cases',
              cell: (info) => <span className="tabular-nums">{info.getValue() === 0 ? 'none' : info.getValue()}</span>,
            }),
          ]
        : []),
      column.accessor((r) => r.nextReviewDate ?? undefined, {
        id: 'nextReview',
        header: 'Next review',
        sortUndefined: 'last',
        cell: (info) =>
          info.getValue() ? (
            <span className="whitespace-nowrap tabular-nums">{formatDate(info.getValue())}</span>
          ) : (
            <span className="text-muted">none set</span>
          ),
      }),
      ...(clinical
        ? [
            column.accessor((r) => r.latestPainReport?.reportedAt ?? undefined, {
              id: 'pain',
              header: 'Latest pain report',
              sortUndefined: 'last',
              cell: (info) => {
                const report = info.row.original.latestPainReport;
                if (!report) return <span className="text-muted">none yet</span>;
                return (
                  <span className="tabular-nums">
                    <Link
                      to={painReportHref(report.id)}
                      aria-label={`Pain report of ${info.row.original.athleteName}, ${report.painNow}/10`}
                    >
                      {report.painNow}/10
                    </Link>{' '}
                    <span className="text-muted">· {formatDateTime(report.reportedAt)}</span>
                  </span>
                );
              },
            }),
          ]
        : []),
      column.accessor((r) => r.sport ?? '', {
        id: 'sport',
        header: 'Sport',
        cell: (info) => info.getValue() || <span className="text-muted">—</span>,
      }),
    ],
    [athleteHref, clinical],
  );

  return (
    <DataTable
      data={shown}
      columns={columns}
      caption={caption}
      hideCaption
      getRowId={(r) => r.athleteId}
      filter={{ label: 'Search athletes', text: (r) => `${r.athleteName} ${r.sport ?? ''}`, placeholder: 'Name or sport' }}
      toolbar={
        <div>
          <label htmlFor={statusId} className="block text-sm font-semibold">
            Status
          </label>
          <select
            id={statusId}
            value={status}
            onChange={(e) => setStatus(e.target.value as ParticipationStatus | 'any')}
            className="mt-1 block min-h-10 rounded-md border border-rule-strong bg-sheet px-2 text-sm"
          >
            <option value="any">Any status</option>
            {PARTICIPATION_STATUSES.map((s) => (
              <option key={s} value={s}>
                {STATUS_LABELS[s]} only
              </option>
            ))}
          </select>
        </div>
      }
      empty={status === 'any' ? empty : `No athlete is ${STATUS_LABELS[status]} right now.`}
      noun={{ one: 'athlete', many: 'athletes' }}
      initialSorting={[{ id: 'status', desc: false }]}
      minWidthClass="min-w-[46rem]"
    />
  );
}
