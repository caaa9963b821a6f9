import { useState } from 'react';
import type { Role } from '../../../../../policies/roles';
import { Button } from '../../../components/ui/Button';
import { CopyField } from '../../../components/ui/CopyField';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Panel } from '../../../components/ui/Panel';
import { formatDateTime } from '../../../lib/format';
import { useCalendarFeed, useStartCalendarFeed, useStopCalendarFeed } from '../api/calendar-feed';

/** What the feed holds, in the reader's terms: one feed per membership carries what each of its roles gives. */
function feedContents(roles: Role[]): string {
  const training = roles.includes('athlete') || roles.includes('coach');
  const family = roles.includes('guardian');
  const parts: string[] = [];
  if (training)
    parts.push(
      "Add your published sessions and stage dates to your phone's calendar. Each entry says what is limited that day; no diagnosis or notes are in it.",
    );
  if (family)
    parts.push(
      `${training ? 'It also lists' : "Add to your phone's calendar"} the planned sessions of each athlete you are linked to as parent or guardian, under their first name. No diagnosis, notes or limits are in it: what they may do stays here in Loadline.`,
    );
  return `${parts.join(' ')} The calendar keeps itself up to date.`;
}

/**
 * A member's private calendar feed in one organization: turn it on, copy the address (shown only
 * right after it is made: the server keeps only a hash of it), make a new one, or turn it off.
 */
export function CalendarFeedPanel({
  orgId,
  organizationName,
  timeZone,
  roles,
}: {
  orgId: string;
  organizationName?: string;
  timeZone: string;
  roles: Role[];
}) {
  const feed = useCalendarFeed(orgId);
  const start = useStartCalendarFeed(orgId);
  const stop = useStopCalendarFeed(orgId);
  const [url, setUrl] = useState<string | null>(null);
  const busy = start.isPending || stop.isPending;

  const turnOn = () => start.mutate(undefined, { onSuccess: (f) => setUrl(f.url ?? null) });
  const turnOff = () => stop.mutate(undefined, { onSuccess: () => setUrl(null) });

  return (
    <Panel title={organizationName ? `Calendar feed: ${organizationName}` : 'Calendar feed'}>
      <div className="space-y-3 text-sm">
        <p>{feedContents(roles)}</p>
        <p className="text-ink-2">
          Anyone with the address can read the feed, so keep it to yourself. If it gets out, make a new one: the old one stops working at
          once.
        </p>
        {feed.isPending ? (
          <p className="text-muted">Loading…</p>
        ) : feed.data?.on ? (
          <>
            <p>
              <span className="font-semibold">On</span> since {formatDateTime(feed.data.since, timeZone)}.
            </p>
            {url ? (
              <CopyField label="Your feed address (shown only now)" value={url} buttonLabel="Copy address" />
            ) : (
              <p className="text-ink-2">The address is shown only when it is made. Lost it? Make a new one.</p>
            )}
            <div className="flex flex-wrap gap-2">
              <Button variant="secondary" onClick={turnOn} busy={start.isPending} disabled={busy}>
                Make a new address
              </Button>
              <Button variant="secondary" onClick={turnOff} busy={stop.isPending} disabled={busy}>
                Turn off
              </Button>
            </div>
          </>
        ) : (
          <>
            {stop.isSuccess && <Notice tone="info">The feed is off; its address no longer works.</Notice>}
            <Button onClick={turnOn} busy={start.isPending} disabled={busy}>
              Turn on calendar feed
            </Button>
          </>
        )}
        <ErrorNotice error={feed.error ?? start.error ?? stop.error} />
      </div>
    </Panel>
  );
}
