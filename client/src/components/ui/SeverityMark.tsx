import { cx } from './cx';

export type Severity = 'emergency' | 'urgent' | 'routine';

export const SEVERITY_WORDS: Record<Severity, string> = {
  emergency: 'Emergency',
  urgent: 'Urgent',
  routine: 'Routine',
};

const SEVERITY_MEANING: Record<Severity, string> = {
  emergency: 'needs action now',
  urgent: 'needs a look today',
  routine: 'for your information',
};

function Shape({ severity }: { severity: Severity }) {
  // A solid triangle, an outlined triangle, an open circle: three shapes that read in greyscale.
  return (
    <svg width="16" height="16" viewBox="0 0 16 16" aria-hidden="true" focusable="false" data-shape={severity}>
      {severity === 'routine' ? (
        <circle cx="8" cy="8" r="5.5" fill="none" stroke="currentColor" strokeWidth="2" />
      ) : (
        <path
          d="M8 1.8 L14.6 13.8 H1.4 Z"
          fill={severity === 'emergency' ? 'currentColor' : 'none'}
          stroke="currentColor"
          strokeWidth="1.8"
          strokeLinejoin="round"
        />
      )}
    </svg>
  );
}

/** How pressing a flag or notice is, as a word plus a shape — never colour alone. */
export function SeverityMark({ severity, className }: { severity: Severity; className?: string }) {
  const word = SEVERITY_WORDS[severity];
  return (
    <span
      role="img"
      aria-label={`${word}: ${SEVERITY_MEANING[severity]}`}
      className={cx(
        'inline-flex items-center gap-1.5 font-semibold whitespace-nowrap',
        severity === 'routine' ? 'text-ink-2' : 'text-line-deep',
        className,
      )}
    >
      <Shape severity={severity} />
      <span>{word}</span>
    </span>
  );
}
