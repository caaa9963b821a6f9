import type { ReactNode } from 'react';
import { isApiError } from '../../lib/api-client';
import { cx } from './cx';

type Tone = 'info' | 'caution' | 'problem' | 'done';

const TONES: Record<Tone, string> = {
  info: 'border-rule bg-sheet',
  done: 'border-ink bg-sheet',
  caution: 'border-line bg-sheet',
  problem: 'border-line-deep bg-sheet',
};

export interface NoticeProps {
  tone?: Tone;
  title?: ReactNode;
  children?: ReactNode;
  /** 'alert' interrupts a screen reader; use it only for something that just went wrong. */
  role?: 'alert' | 'status';
  className?: string;
}

/** A bordered message block. The thick left rule carries the tone, so it reads without colour. */
export function Notice({ tone = 'info', title, children, role, className }: NoticeProps) {
  return (
    <div role={role} className={cx('rounded-md border border-l-8 px-4 py-3 text-sm', TONES[tone], className)}>
      {title && <p className="font-semibold">{title}</p>}
      {children && <div className={cx(title ? 'mt-1' : undefined, 'text-ink-2 [&_p+p]:mt-1')}>{children}</div>}
    </div>
  );
}

export interface ErrorWording {
  /** Replaces the server's sentence for a stale edit, e.g. "Someone else changed this person…". */
  versionConflict?: string;
  notFound?: string;
}

/** The sentence a person reads for a failure. A refusal always starts "You can't do that:". */
export function describeError(error: unknown, wording: ErrorWording = {}): string {
  if (!isApiError(error)) return 'Something unexpected happened. Please try again.';
  switch (error.code) {
    case 'forbidden':
      return `You can't do that: ${error.message}`;
    case 'csrf_failed':
      return `You can't do that: ${error.message} Your session was refreshed; please try again.`;
    case 'version_conflict':
      return wording.versionConflict ?? error.message;
    case 'not_found':
      return wording.notFound ?? error.message;
    default:
      return error.status === 403 ? `You can't do that: ${error.message}` : error.message;
  }
}

export function ErrorNotice({
  error,
  wording,
  title,
  className,
}: {
  error: unknown;
  wording?: ErrorWording;
  title?: string;
  className?: string;
}) {
  if (!error) return null;
  const requestId = isApiError(error) ? error.requestId : null;
  return (
    <Notice tone="problem" role="alert" title={title} className={className}>
      <p>{describeError(error, wording)}</p>
      {requestId && <p className="text-xs text-muted">Reference for support: {requestId}</p>}
    </Notice>
  );
}
