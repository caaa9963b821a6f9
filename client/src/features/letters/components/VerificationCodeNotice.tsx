import { useEffect, useRef } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '../../../components/ui/Button';

/**
 * The code, shown once right after signing. The server keeps only a fingerprint of it, so it can
 * never be shown again here; it is printed on the letter.
 */
export function VerificationCodeNotice({ code, athleteName, onDone }: { code: string; athleteName: string; onDone: () => void }) {
  const ref = useRef<HTMLDivElement>(null);
  // The signing form has just gone away; take the reader to what replaced it.
  useEffect(() => ref.current?.focus(), []);
  const checkAddress = `${window.location.origin}/check`;

  return (
    <div
      ref={ref}
      tabIndex={-1}
      role="status"
      className="rounded-md border border-l-8 border-ink bg-sheet px-4 py-3 text-sm focus:outline-none focus-visible:outline-3"
    >
      <p className="font-semibold">Letter for {athleteName} signed. The e-mails are on their way.</p>
      <p className="mt-3 text-muted">Verification code</p>
      <p className="font-mono text-2xl font-bold tracking-wider break-all">{code}</p>
      <p className="mt-2 text-ink-2">
        Anyone holding the letter can check it at <Link to="/check">/check</Link> ({checkAddress}). The code is printed on the letter; it is
        shown here only this once.
      </p>
      <Button variant="secondary" size="sm" className="mt-3" onClick={onDone}>
        I have noted the code
      </Button>
    </div>
  );
}
