import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import { createColumnHelper } from '@tanstack/react-table';
import type { RosterRowDto } from '../../../../../policies/dto';
import type { ParticipationStatus } from '../../../../../policies/load/patterns';
import { DataTable } from '../../../components/ui/DataTable';
import { StatusMark } from '../../../components/ui/StatusMark';
import { formatDate } from '../../../lib/format';

const column = createColumnHelper<RosterRowDto>();

/** Out first, then Limited: who needs attention rises to the top. */
const STATUS_RANK: Record<ParticipationStatus, number> = { out: 0, limited: 1, full: 2 };
const LIMITS_SHOWN = 2;

/**
 * The coach's roster: who is limited today and how, which published sessions are on hold, which
 * exception requests wait for the clinician, and what comes next.
 */
export function RosterTable({
  rows,
  athleteHref,
  caption,
  empty,
}: {
  rows: RosterRowDto[];
  athleteHref: (id: string) => string;
  caption: string;
  empty: string;
}) {
  const columns = useMemo(
    () => [
      column.accessor('athleteName', {
        header: 'Athlete',
        cell: (info) => (
          <Link
            to={athleteHref(info.row.original.athleteId)}
            className="font-semibold whitespace-nowrap underline decoration-rule-strong underline-offset-4"
          >
            {info.getValue()}
          </Link>
        ),
      }),
      column.accessor((r) => STATUS_RANK[r.status], {
        id: 'status',
        header: 'Status',
        cell: (info) => <StatusMark status={info.row.original.status} />,
      }),
      column.accessor((r) => r.limitsToday.length, {
        id: 'limits',
        header: 'Limits today',
        cell: (info) => {
          const limits = info.row.original.limitsToday;
          if (limits.length === 0) return <span className="text-muted">none</span>;
          return (
            <ul className="max-w-[24rem] space-y-0.5 text-xs leading-snug">
              {limits.slice(0, LIMITS_SHOWN).map((l) => (
                <li key={l}>{l}</li>
              ))}
              {limits.length > LIMITS_SHOWN && (
                <li className="text-muted">
                  and {limits.length - LIMITS_SHOWN} more — <Link to={athleteHref(info.row.original.athleteId)}>see all</Link>
                </li>
              )}
            </ul>
          );
        },
      }),
      column.accessor('sessionsOnHold', {
        header: 'On hold',
        cell: (info) =>
          info.getValue() > 0 ? (
            <span className="inline-flex items-center gap-1 rounded border border-line-deep px-1.5 py-0.5 font-semibold whitespace-nowrap text-line-deep tabular-nums">
              <span aria-hidden="true">▲</span>
              {info.getValue()} on hold
            </span>
          ) : (
            <span className="text-muted tabular-nums">0</span>
          ),
      }),
      column.accessor('pendingExceptions', {
        header: 'Exceptions waiting',
        cell: (info) => (
          <span className={info.getValue() > 0 ? 'font-semibold tabular-nums' : 'text-muted tabular-nums'}>{info.getValue()}</span>
        ),
      }),
      column.accessor((r) => r.nextSession?.date ?? undefined, {
        id: 'next',
        header: 'Next session',
        sortUndefined: 'last',
        cell: (info) => {
          const next = info.row.original.nextSession;
          if (!next) return <span className="text-muted">none published</span>;
          return (
            <span className="whitespace-nowrap tabular-nums">
              {formatDate(next.date)} <span className="text-ink-2">· {next.title}</span>
            </span>
          );
        },
      }),
    ],
    [athleteHref],
  );

  return (
    <DataTable
      data={rows}
      columns={columns}
      caption={caption}
      hideCaption
      getRowId={(r) => r.athleteId}
      filter={{ label: 'Search athletes', text: (r) => `${r.athleteName} ${r.limitsToday.join(' ')}`, placeholder: 'Name or limit' }}
      empty={empty}
      noun={{ one: 'athlete', many: 'athletes' }}
      initialSorting={[{ id: 'status', desc: false }]}
      minWidthClass="min-w-[52rem]"
    />
  );
}
