import { cx } from './cx';

/** Participation status, drawn as a word plus a shape so it reads in greyscale and without colour. */
export type ParticipationStatus = 'out' | 'limited' | 'full';

export const STATUS_WORDS: Record<ParticipationStatus, string> = {
  out: 'Out',
  limited: 'Limited',
  full: 'Full',
};

const STATUS_MEANING: Record<ParticipationStatus, string> = {
  out: 'no training until the clinician says so',
  limited: 'training within the limits the clinician set',
  full: 'cleared for full training',
};

function Shape({ status, size }: { status: ParticipationStatus; size: number }) {
  // An open square is empty, a half-filled square is filled from the bottom, a full one is solid.
  return (
    <svg width={size} height={size} viewBox="0 0 16 16" aria-hidden="true" focusable="false" data-shape={status}>
      <rect x="1.5" y="1.5" width="13" height="13" fill="none" stroke="currentColor" strokeWidth="2" />
      {status === 'limited' && <rect x="1.5" y="8" width="13" height="6.5" fill="currentColor" />}
      {status === 'full' && <rect x="1.5" y="1.5" width="13" height="13" fill="currentColor" />}
    </svg>
  );
}

export interface StatusMarkProps {
  status: ParticipationStatus;
  size?: 'sm' | 'lg';
  /** Adds a plain-words line under the status word. */
  explain?: boolean;
  className?: string;
}

export function StatusMark({ status, size = 'sm', explain, className }: StatusMarkProps) {
  const word = STATUS_WORDS[status];
  return (
    <span
      role="img"
      aria-label={`Participation status: ${word}${explain ? ` — ${STATUS_MEANING[status]}` : ''}`}
      className={cx('inline-flex items-center gap-1.5 font-semibold text-ink', size === 'lg' && 'text-lg', className)}
    >
      <Shape status={status} size={size === 'lg' ? 22 : 14} />
      <span>
        {word}
        {explain && <span className="block text-sm font-normal text-ink-2">{STATUS_MEANING[status]}</span>}
      </span>
    </span>
  );
}
