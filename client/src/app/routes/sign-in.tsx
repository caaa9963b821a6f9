import { Link, Navigate, useLocation, useNavigate } from 'react-router-dom';
import { useSession } from '../../features/auth/api/get-session';
import { SignInForm } from '../../features/auth/components/SignInForm';
import { useDocumentTitle } from '../../lib/use-document-title';
import { CenteredShell } from '../layout/RootLayout';

/** Only same-site paths are followed after sign-in, never a full address from the outside. */
function safeReturnPath(state: unknown): string {
  const from = (state as { from?: unknown } | null)?.from;
  return typeof from === 'string' && from.startsWith('/') && !from.startsWith('//') && from !== '/sign-in'
    ? from
    : '/';
}

export function SignInPage() {
  useDocumentTitle('Sign in');
  const session = useSession();
  const location = useLocation();
  const navigate = useNavigate();
  const returnTo = safeReturnPath(location.state);

  if (session.data?.user) return <Navigate to={returnTo} replace />;

  return (
    <CenteredShell>
      <h1 className="text-2xl font-bold">Sign in to Loadline</h1>
      <p className="mt-1 mb-6 text-sm text-ink-2">
        For athletes, guardians, coaches, clinicians and administrators of your organization.
      </p>
      <SignInForm onSignedIn={() => navigate(returnTo, { replace: true })} />
      <p className="mt-6 text-sm text-ink-2">
        New here? Open the invitation link your organization sent you. Lost your password? Ask your organization&apos;s
        administrator for help; password reset arrives in a coming release.
      </p>
      <p className="mt-2 text-sm">
        <Link to="/invite">I have an invitation link</Link>
      </p>
    </CenteredShell>
  );
}
