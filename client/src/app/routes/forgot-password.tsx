import { Link } from 'react-router-dom';
import { ForgotPasswordForm } from '../../features/auth/components/ForgotPasswordForm';
import { useDocumentTitle } from '../../lib/use-document-title';
import { CenteredShell } from '../layout/RootLayout';

export function ForgotPasswordPage() {
  useDocumentTitle('Forgot your password?');
  return (
    <CenteredShell>
      <h1 className="text-2xl font-bold">Forgot your password?</h1>
      <p className="mt-1 mb-6 text-sm text-ink-2">
        Enter the e-mail address you sign in with. We&apos;ll send a link to choose a new password.
      </p>
      <ForgotPasswordForm />
      <p className="mt-6 text-sm">
        <Link to="/sign-in">Back to sign in</Link>
      </p>
    </CenteredShell>
  );
}
