import { useState } from 'react';
import { Link, Navigate, useLocation, useNavigate } from 'react-router-dom';
import type { OrganizationSignupConfirmedDto, SessionDto } from '../../../../policies/dto';
import { useSession } from '../../features/auth/api/get-session';
import { useSignupStatus } from '../../features/organization-signup/api/org-signup';
import { SignInForm } from '../../features/auth/components/SignInForm';
import { SecondStepForm } from '../../features/auth/components/SecondStepForm';
import { Notice } from '../../components/ui/Notice';
import { useDocumentTitle } from '../../lib/use-document-title';
import { CenteredShell } from '../layout/RootLayout';

/** Only same-site paths are followed after sign-in, never a full address from the outside. */
function safeReturnPath(state: unknown): string {
  const from = (state as { from?: unknown } | null)?.from;
  return typeof from === 'string' && from.startsWith('/') && !from.startsWith('//') && from !== '/sign-in' ? from : '/';
}

export function SignInPage() {
  useDocumentTitle('Sign in');
  const session = useSession();
  const location = useLocation();
  const navigate = useNavigate();
  const returnTo = safeReturnPath(location.state);
  // "Start again" leaves the code screen; the half-finished sign-in on the server simply times out.
  const [startedOver, setStartedOver] = useState(false);
  // The password step answers either a signed-in session or one waiting for a code.
  const onSignedIn = (s: SessionDto) => {
    if (s.user) navigate(returnTo, { replace: true });
    else setStartedOver(false);
  };

  const signup = useSignupStatus();
  const started = (location.state as { organizationStarted?: OrganizationSignupConfirmedDto } | null)?.organizationStarted;

  if (session.data?.user) return <Navigate to={returnTo} replace />;

  if (session.data?.secondStep && !startedOver) {
    return (
      <CenteredShell>
        <h1 className="text-2xl font-bold">One more step</h1>
        <div className="mt-4">
          <SecondStepForm onSignedIn={onSignedIn} onStartOver={() => setStartedOver(true)} />
        </div>
      </CenteredShell>
    );
  }

  return (
    <CenteredShell>
      <h1 className="text-2xl font-bold">Sign in to Loadline</h1>
      <p className="mt-1 mb-6 text-sm text-ink-2">For athletes, guardians, coaches, clinicians and administrators of your organization.</p>
      {(location.state as { passwordChanged?: boolean } | null)?.passwordChanged && (
        <Notice tone="done" role="status" className="mb-4">
          <p>Your new password is saved, and any other device signed in to your account was signed out. Sign in with the new password.</p>
        </Notice>
      )}
      {started && (
        <Notice tone="done" role="status" className="mb-4" title={`${started.organizationName} is ready`}>
          <p>
            {started.existingAccount
              ? `Sign in as ${started.email} with the password you already use: the new organization is now beside your others.`
              : `Your address is confirmed. Sign in as ${started.email} with the password you chose.`}
          </p>
        </Notice>
      )}
      <SignInForm onSignedIn={onSignedIn} />
      <p className="mt-4 text-sm">
        <Link to="/forgot-password">Forgot your password?</Link>
      </p>
      <p className="mt-6 text-sm text-ink-2">New here? Open the invitation link your organization sent you.</p>
      <p className="mt-2 text-sm">
        <Link to="/invite">I have an invitation link</Link>
      </p>
      {signup.data?.open && (
        <p className="mt-2 text-sm">
          <Link to="/start">Start an organization</Link>
        </p>
      )}
    </CenteredShell>
  );
}
