import type { OutboxMessageDto } from '../../../../../policies/dto';
import { formatDateTime } from '../../../lib/format';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Loading } from '../../../components/ui/Panel';
import { isOutboxOff, useOutbox } from '../api/get-outbox';

export function formatSize(bytes: number): string {
  if (bytes < 1024) return `${bytes} bytes`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(1)} KB`;
  return `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
}

/** What the local test mail server received, newest first: who, what, when, attachments, and the text on request. */
export function OutboxList({ orgId }: { orgId: string }) {
  const outbox = useOutbox(orgId);
  if (outbox.isPending) return <Loading what="the outbox" />;
  if (outbox.isError) {
    return isOutboxOff(outbox.error) ? (
      <Notice tone="info" title="No local mailbox">
        <p>The outbox shows only while the local test mail server is in use.</p>
      </Notice>
    ) : (
      <ErrorNotice error={outbox.error} />
    );
  }
  if (outbox.data.length === 0) return <p className="text-sm text-ink-2">No messages yet. Invitations and signed letters land here.</p>;
  return (
    <ol className="space-y-3" aria-label="Messages, newest first">
      {outbox.data.map((message) => (
        <li key={message.id}>
          <OutboxMessage message={message} />
        </li>
      ))}
    </ol>
  );
}

function OutboxMessage({ message }: { message: OutboxMessageDto }) {
  return (
    <article className="rounded-lg border border-rule bg-sheet p-3 text-sm sm:p-4">
      <div className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1">
        <h3 className="text-base font-bold">{message.subject || '(no subject)'}</h3>
        <span className="text-muted tabular-nums">{formatDateTime(message.receivedAt)}</span>
      </div>
      <dl className="mt-2 grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1">
        <dt className="text-muted">To</dt>
        <dd className="break-all">{message.to.join(', ')}</dd>
        <dt className="text-muted">Attachments</dt>
        <dd>
          {message.attachments.length === 0 ? (
            'none'
          ) : (
            <ul>
              {message.attachments.map((a, i) => (
                <li key={`${a.filename}-${i}`} className="break-all">
                  {a.filename}{' '}
                  <span className="text-muted tabular-nums">
                    ({formatSize(a.size)}, {a.contentType})
                  </span>
                </li>
              ))}
            </ul>
          )}
        </dd>
      </dl>
      {message.text && (
        <details className="mt-2">
          <summary className="cursor-pointer font-semibold">Show the message text</summary>
          <pre className="mt-2 overflow-x-auto rounded-md bg-paper p-3 font-mono text-xs whitespace-pre-wrap">{message.text}</pre>
        </details>
      )}
    </article>
  );
}
