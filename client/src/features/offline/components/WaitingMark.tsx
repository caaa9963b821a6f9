/**
 * "Waiting to be sent", drawn as a small clock face of our own: a text glyph for it may be missing from
 * the phone's fonts, and a drawing reads the same everywhere. The label is what a screen reader says
 * (WCAG 2.2, 1.1.1 Non-text Content).
 */
export function WaitingMark({ label = 'Waiting to be sent' }: { label?: string }) {
  return (
    <svg
      role="img"
      aria-label={label}
      width="16"
      height="16"
      viewBox="0 0 16 16"
      focusable="false"
      data-shape="waiting"
      className="mr-1.5 inline-block shrink-0 align-[-3px]"
    >
      <circle cx="8" cy="8" r="6.25" fill="none" stroke="currentColor" strokeWidth="1.5" />
      <path d="M8 4.5 V8 L10.5 9.5" fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinecap="round" strokeLinejoin="round" />
    </svg>
  );
}
