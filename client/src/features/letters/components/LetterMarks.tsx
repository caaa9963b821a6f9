import { cx } from '../../../components/ui/cx';
import { LETTER_STATUS_MEANING, LETTER_STATUS_WORDS, type LetterStatus } from './letter-words';

export type SealShape = 'signed' | 'scheduled' | 'draft' | 'expired' | 'superseded' | 'unknown';

/**
 * A letter's standing as a round seal, so it never reads as a participation status (those are
 * squares): solid with a tick when signed and in force, open with a tick when signed but not yet in
 * force, dashed when a draft, open with clock hands when past its valid-until date, struck through when
 * superseded, and open with a question mark when no letter matches.
 */
export function Seal({ shape, size = 16 }: { shape: SealShape; size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 24 24" aria-hidden="true" focusable="false" data-shape={shape}>
      {shape === 'signed' ? (
        <>
          <circle cx="12" cy="12" r="10.5" fill="currentColor" />
          <path
            d="M7 12.5 L10.5 16 L17 8.5"
            fill="none"
            stroke="var(--color-sheet)"
            strokeWidth="2.6"
            strokeLinecap="round"
            strokeLinejoin="round"
          />
        </>
      ) : shape === 'scheduled' ? (
        <>
          <circle cx="12" cy="12" r="9.5" fill="none" stroke="currentColor" strokeWidth="2.2" />
          <path
            d="M7.5 12.5 L10.5 15.5 L16.5 8.8"
            fill="none"
            stroke="currentColor"
            strokeWidth="2.4"
            strokeLinecap="round"
            strokeLinejoin="round"
          />
        </>
      ) : shape === 'draft' ? (
        <circle cx="12" cy="12" r="9.5" fill="none" stroke="currentColor" strokeWidth="2.2" strokeDasharray="3.2 2.6" />
      ) : shape === 'expired' ? (
        <>
          <circle cx="12" cy="12" r="9.5" fill="none" stroke="currentColor" strokeWidth="2.2" />
          <path d="M12 6.5 V12 L16 14.5" fill="none" stroke="currentColor" strokeWidth="2.4" strokeLinecap="round" strokeLinejoin="round" />
        </>
      ) : shape === 'superseded' ? (
        <>
          <circle cx="12" cy="12" r="9.5" fill="none" stroke="currentColor" strokeWidth="2.2" />
          <path d="M5.5 18.5 L18.5 5.5" stroke="currentColor" strokeWidth="2.6" strokeLinecap="round" />
        </>
      ) : (
        <>
          <circle cx="12" cy="12" r="9.5" fill="none" stroke="currentColor" strokeWidth="2.2" />
          <path
            d="M9.2 9.3 a2.9 2.9 0 1 1 4 2.7 c-0.9 0.4 -1.2 1 -1.2 1.9"
            fill="none"
            stroke="currentColor"
            strokeWidth="2.2"
            strokeLinecap="round"
          />
          <circle cx="12" cy="17.2" r="1.3" fill="currentColor" />
        </>
      )}
    </svg>
  );
}

/** Draft, Signed (not yet in force), Signed, Expired or Superseded: a word plus a seal, never colour alone. */
export function LetterStatusMark({ status, className }: { status: LetterStatus; className?: string }) {
  const word = LETTER_STATUS_WORDS[status];
  return (
    <span
      role="img"
      aria-label={`Letter status: ${word} — ${LETTER_STATUS_MEANING[status]}`}
      className={cx(
        'inline-flex items-center gap-1.5 font-semibold whitespace-nowrap',
        status === 'superseded' ? 'text-ink-2' : 'text-ink',
        className,
      )}
    >
      <Seal shape={status} />
      <span>{word}</span>
    </span>
  );
}
