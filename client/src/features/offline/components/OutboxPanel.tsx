import { useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { Button } from '../../../components/ui/Button';
import { Notice } from '../../../components/ui/Notice';
import { Panel } from '../../../components/ui/Panel';
import { formatDate, formatDateTime } from '../../../lib/format';
import { useCurrentMembership } from '../../../lib/membership-context';
import {
  canSendWithoutPlan,
  discardOutboxItem,
  flushOutbox,
  retryOutboxItem,
  useOutbox,
  type OutboxItem,
  type OutboxKind,
} from '../../../lib/offline-queue';
import { queryKeys } from '../../../lib/query-keys';
import { WaitingMark } from './WaitingMark';

const KIND_WORDS: Record<OutboxKind, string> = {
  pain_report: 'Pain report',
  check_in: 'Check-in',
  training_log: 'Session log',
};

/** "Session log of Thu 3 Dec 2026, made Thu 3 Dec 2026 14:05". */
function describe(item: OutboxItem): string {
  const date = (item.body as { date?: unknown } | null)?.date;
  const of = typeof date === 'string' ? ` of ${formatDate(date)}` : '';
  return `${KIND_WORDS[item.kind]}${of}, made ${formatDateTime(item.madeAt)}`;
}

/**
 * What this phone still holds for the athlete: what waits for signal, and what Loadline refused when it
 * arrived, with the reason, kept until the athlete sends it again or lets it go.
 */
export function OutboxPanel() {
  const { orgId, user } = useCurrentMembership();
  const queryClient = useQueryClient();
  const items = useOutbox(user.id).filter((i) => i.orgId === orgId);
  const [sending, setSending] = useState(false);
  if (items.length === 0) return null;
  const waiting = items.filter((i) => i.state === 'waiting');
  const rejected = items.filter((i) => i.state === 'rejected');

  const sendNow = () => {
    setSending(true);
    void flushOutbox(user.id)
      .then((sent) => {
        if (sent > 0) void queryClient.invalidateQueries({ queryKey: queryKeys.org(orgId) });
      })
      .finally(() => setSending(false));
  };

  return (
    <Panel title="Kept on this phone">
      <div className="space-y-4">
        {waiting.length > 0 && (
          <div className="space-y-2">
            <p className="text-base">
              {waiting.length === 1 ? 'One entry is' : `${waiting.length} entries are`} waiting for signal. They are sent in the order you
              made them as soon as Loadline can be reached.
            </p>
            <ul className="space-y-1 text-sm">
              {waiting.map((i) => (
                <li key={i.key} className="rounded-md border border-rule px-3 py-2">
                  <WaitingMark />
                  {describe(i)}
                </li>
              ))}
            </ul>
            <Button variant="secondary" busy={sending} onClick={sendNow}>
              Send now
            </Button>
          </div>
        )}
        {rejected.map((i) => (
          <Notice key={i.key} tone="caution" role="alert" title={`Not accepted: ${describe(i)}`}>
            <p>{i.reason}</p>
            <p>It stays here until you send it again or discard it.</p>
            <div className="mt-2 flex flex-wrap gap-2">
              {canSendWithoutPlan(i) && (
                <Button
                  variant="secondary"
                  size="sm"
                  onClick={() => {
                    retryOutboxItem(user.id, i.key, { withoutPlan: true });
                    sendNow();
                  }}
                >
                  Send as a session of its own
                </Button>
              )}
              <Button
                variant="secondary"
                size="sm"
                onClick={() => {
                  retryOutboxItem(user.id, i.key);
                  sendNow();
                }}
              >
                Send again
              </Button>
              <Button variant="quiet" size="sm" onClick={() => discardOutboxItem(user.id, i.key)}>
                Discard
              </Button>
            </div>
          </Notice>
        ))}
        <p className="text-sm text-muted">Signing out removes what is kept here, sent or not.</p>
      </div>
    </Panel>
  );
}
