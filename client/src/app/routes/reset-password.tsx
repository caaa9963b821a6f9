import { useLocation, useNavigate } from 'react-router-dom';
import { ResetPasswordForm } from '../../features/auth/components/ResetPasswordForm';
import { useDocumentTitle } from '../../lib/use-document-title';
import { CenteredShell } from '../layout/RootLayout';

export function ResetPasswordPage() {
  useDocumentTitle('Choose a new password');
  const location = useLocation();
  const navigate = useNavigate();
  return (
    <CenteredShell>
      <h1 className="text-2xl font-bold">Choose a new password</h1>
      <p className="mt-1 mb-6 text-sm text-ink-2">Pick a password you don&apos;t use anywhere else.</p>
      {/* Leaving with replace drops the token-bearing address from the history. */}
      <ResetPasswordForm hash={location.hash} onDone={() => navigate('/sign-in', { replace: true, state: { passwordChanged: true } })} />
    </CenteredShell>
  );
}
