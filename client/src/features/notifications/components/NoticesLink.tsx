import { useId } from 'react';
import { NavLink } from 'react-router-dom';
import { cx } from '../../../components/ui/cx';
import { useNotifications } from '../api/get-notifications';

/**
 * The header's way to the notices, with the unread count. The link is named "Notices"; the count is
 * its description, so the name stays the same whatever the number.
 */
export function NoticesLink({ orgId }: { orgId: string }) {
  const notices = useNotifications(orgId);
  const countId = useId();
  const unread = (notices.data ?? []).filter((n) => !n.readAt).length;
  const pressing = (notices.data ?? []).filter((n) => !n.readAt && n.severity !== 'routine').map((n) => n.severity);
  const urgent = pressing.length > 0;
  return (
    <>
      <NavLink
        to="/notices"
        aria-describedby={countId}
        className={({ isActive }) =>
          cx(
            'inline-flex min-h-9 items-center gap-1.5 rounded px-1 text-sm font-semibold no-underline',
            isActive && 'underline decoration-line decoration-2',
          )
        }
      >
        <svg width="16" height="16" viewBox="0 0 16 16" aria-hidden="true" focusable="false">
          <path
            d="M8 1.5a4.5 4.5 0 0 0-4.5 4.5v3.2L2 11.5h12l-1.5-2.3V6A4.5 4.5 0 0 0 8 1.5Z"
            fill="none"
            stroke="currentColor"
            strokeWidth="1.5"
            strokeLinejoin="round"
          />
          <path d="M6.2 13.2a1.9 1.9 0 0 0 3.6 0" fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinecap="round" />
        </svg>
        Notices
        {unread > 0 && (
          <span
            aria-hidden="true"
            className={cx(
              'inline-flex min-w-5 items-center justify-center rounded-full px-1.5 text-xs leading-5 tabular-nums',
              urgent ? 'bg-line-deep text-sheet' : 'bg-ink text-paper',
            )}
          >
            {unread > 99 ? '99+' : unread}
          </span>
        )}
      </NavLink>
      <span id={countId} className="sr-only">
        {unread === 0
          ? 'No unread notices'
          : `${unread} unread${pressing.includes('emergency') ? ', including an emergency' : urgent ? ', including an urgent one' : ''}`}
      </span>
    </>
  );
}
