import { Link } from 'react-router-dom';
import { createColumnHelper } from '@tanstack/react-table';
import type { FlagDto } from '../../../../../policies/dto';
import { formatDateTime } from '../../../lib/format';
import { painReportHref } from '../../../lib/pain-report-href';
import { Button } from '../../../components/ui/Button';
import { DataTable } from '../../../components/ui/DataTable';
import { ErrorNotice } from '../../../components/ui/Notice';
import { SeverityMark } from '../../../components/ui/SeverityMark';
import { useAcknowledgeFlag } from '../api/acknowledge-flag';

const KIND_WORDS: Record<FlagDto['kind'], string> = {
  red_flag_emergency: 'Warning sign (emergency)',
  red_flag_urgent: 'Warning sign',
  pain_report: 'Pain report',
  pain_rule: 'Pain response to training',
  over_limit: 'Logged over a limit',
};

/** The next step in plain words: the server's suggestion when it made one, otherwise by kind. */
export function suggestedAction(flag: FlagDto): string {
  if (flag.suggestedAction === 'reduce') return 'Make the next session lighter.';
  if (flag.suggestedAction === 'keep') return 'Keep to the plan.';
  switch (flag.kind) {
    case 'red_flag_emergency':
      return 'Make sure the athlete is getting urgent medical care now.';
    case 'red_flag_urgent':
      return 'The clinician reviews the athlete today.';
    case 'pain_report':
      return 'Read the report; the clinician decides on any change.';
    case 'pain_rule':
      return 'Review the pain response before the next session.';
    case 'over_limit':
      return 'Talk it through with the athlete before the next session; the clinician decides any change to the limits.';
  }
}

const SEVERITY_ORDER = { emergency: 0, urgent: 1, routine: 2 } as const;
const column = createColumnHelper<FlagDto>();

/** Flags for staff, newest first; acknowledging records who has seen it, and when. */
export function FlagList({
  orgId,
  flags,
  athleteHref,
  caption,
}: {
  orgId: string;
  flags: FlagDto[];
  athleteHref: (athleteId: string) => string;
  caption: string;
}) {
  const acknowledge = useAcknowledgeFlag(orgId);
  const columns = [
    column.accessor((f) => SEVERITY_ORDER[f.severity], {
      id: 'severity',
      header: 'Severity',
      cell: (c) => <SeverityMark severity={c.row.original.severity} />,
    }),
    column.accessor('createdAt', {
      header: 'Raised',
      cell: (c) => <span className="whitespace-nowrap tabular-nums">{formatDateTime(c.getValue())}</span>,
    }),
    column.accessor('athleteName', {
      header: 'Athlete',
      cell: (c) => (
        <Link to={athleteHref(c.row.original.athleteId)} className="font-semibold whitespace-nowrap">
          {c.getValue()}
        </Link>
      ),
    }),
    column.accessor('message', {
      header: 'What happened',
      enableSorting: false,
      cell: (c) => (
        <>
          <span id={`flag-${c.row.original.id}`}>
            <span className="block text-xs font-semibold text-ink-2 uppercase">{KIND_WORDS[c.row.original.kind]}</span>
            {c.getValue()}
          </span>
          {c.row.original.painReportId && (
            <Link to={painReportHref(c.row.original.painReportId)} className="mt-1 block text-sm font-semibold whitespace-nowrap">
              Read the report
            </Link>
          )}
        </>
      ),
    }),
    column.display({ id: 'action', header: 'Suggested action', cell: (c) => suggestedAction(c.row.original) }),
    column.display({
      id: 'ack',
      header: 'Acknowledged',
      cell: (c) => {
        const flag = c.row.original;
        if (flag.acknowledgedAt) {
          return (
            <span className="text-sm text-ink-2">
              <span aria-hidden="true">■ </span>
              By {flag.acknowledgedByName ?? 'a colleague'}, <span className="tabular-nums">{formatDateTime(flag.acknowledgedAt)}</span>
            </span>
          );
        }
        return (
          <Button
            variant="secondary"
            size="sm"
            aria-describedby={`flag-${flag.id}`}
            busy={acknowledge.isPending && acknowledge.variables === flag.id}
            onClick={() => acknowledge.mutate(flag.id)}
          >
            Acknowledge
          </Button>
        );
      },
    }),
  ];

  return (
    <div className="space-y-3">
      <ErrorNotice error={acknowledge.error} title="Not acknowledged" />
      <DataTable
        data={flags}
        columns={columns}
        caption={caption}
        getRowId={(f) => f.id}
        empty="No flags here. New pain reports and pain responses to training for your athletes appear on this page."
        noun={{ one: 'flag', many: 'flags' }}
        initialSorting={[{ id: 'createdAt', desc: true }]}
        filter={{ label: 'Find an athlete', text: (f) => `${f.athleteName} ${f.message}` }}
        minWidthClass="min-w-[60rem]"
      />
    </div>
  );
}
