import { Link } from 'react-router-dom';
import type { NotificationDto } from '../../../../../policies/dto';
import { formatDateTime } from '../../../lib/format';
import { painReportHref } from '../../../lib/pain-report-href';
import { Button } from '../../../components/ui/Button';
import { ErrorNotice } from '../../../components/ui/Notice';
import { SeverityMark } from '../../../components/ui/SeverityMark';
import { cx } from '../../../components/ui/cx';
import { useMarkRead } from '../api/mark-read';

const telHref = (number: string) => `tel:${number.replace(/[^\d+]/g, '')}`;

/**
 * Notices, newest first. Unread ones carry the word "New" and a heavy left rule (not colour alone);
 * an emergency notice repeats the organization's emergency number as a link that dials.
 */
export function NoticeList({
  orgId,
  notices,
  emergencyNumber,
}: {
  orgId: string;
  notices: NotificationDto[];
  emergencyNumber?: string | null;
}) {
  const markRead = useMarkRead(orgId);
  const unread = notices.filter((n) => !n.readAt).length;
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <p className="text-sm text-ink-2 tabular-nums" aria-live="polite">
          {unread === 0 ? 'Everything is read.' : `${unread} unread`}
        </p>
        <Button
          variant="secondary"
          disabled={unread === 0}
          busy={markRead.isPending && markRead.variables === null}
          onClick={() => markRead.mutate(null)}
        >
          Mark all read
        </Button>
      </div>
      <ErrorNotice error={markRead.error} />
      {notices.length === 0 ? (
        <p className="rounded-lg border border-rule bg-sheet p-4 text-sm">
          No notices yet. When something needs your attention, it appears here.
        </p>
      ) : (
        <ol className="space-y-2">
          {notices.map((n) => (
            <li
              key={n.id}
              className={cx(
                'rounded-lg border bg-sheet p-4',
                n.readAt ? 'border-rule' : 'border-l-8',
                !n.readAt && (n.severity === 'routine' ? 'border-ink' : 'border-line-deep'),
              )}
            >
              <div className="flex flex-wrap items-center gap-x-3 gap-y-1 text-sm">
                <SeverityMark severity={n.severity} />
                {!n.readAt && <span className="rounded border border-ink px-1.5 text-xs font-bold">New</span>}
                <span className="text-muted tabular-nums">{formatDateTime(n.createdAt)}</span>
              </div>
              <h2 className="mt-1 text-base font-bold">{n.title}</h2>
              <p className="mt-1 text-sm whitespace-pre-line">{n.body}</p>
              {n.painReportId && (
                <p className="mt-2 text-sm font-semibold">
                  <Link to={painReportHref(n.painReportId)}>Read the report</Link>
                </p>
              )}
              {n.severity === 'emergency' && emergencyNumber && (
                <p className="mt-2 text-sm font-semibold">
                  Emergency number:{' '}
                  <a href={telHref(emergencyNumber)} className="tabular-nums">
                    {emergencyNumber}
                  </a>
                </p>
              )}
              {!n.readAt && (
                <Button
                  variant="quiet"
                  size="sm"
                  className="mt-2"
                  aria-label={`Mark read: ${n.title}`}
                  busy={markRead.isPending && markRead.variables === n.id}
                  onClick={() => markRead.mutate(n.id)}
                >
                  Mark read
                </Button>
              )}
            </li>
          ))}
        </ol>
      )}
    </div>
  );
}
