import { useNavigate, useParams } from 'react-router-dom';
import { CheckLetter } from '../../features/letters/components/CheckLetter';
import { useDocumentTitle } from '../../lib/use-document-title';
import { CenteredShell } from '../layout/RootLayout';

/**
 * Public: anyone holding a letter checks its code here, signed in or not. The answer names only the
 * standing, initials, decision, dates and organization.
 */
export function CheckPage() {
  useDocumentTitle('Check a clearance letter');
  const { code } = useParams();
  const navigate = useNavigate();
  return (
    <CenteredShell>
      <h1 className="text-2xl font-bold">Check a clearance letter</h1>
      <p className="mt-1 mb-6 text-sm text-ink-2">
        Type the verification code printed on the letter to see whether it is genuine and still in force. This page never shows medical
        details.
      </p>
      {/* A new code in the address starts a fresh form and a fresh answer. */}
      <CheckLetter key={code ?? ''} code={code ?? null} onCheck={(next) => navigate(`/check/${encodeURIComponent(next.trim())}`)} />
    </CenteredShell>
  );
}
