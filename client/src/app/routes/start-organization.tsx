import { Link, useLocation, useNavigate } from 'react-router-dom';
import { useSignupStatus } from '../../features/organization-signup/api/org-signup';
import { StartOrganizationForm } from '../../features/organization-signup/components/StartOrganizationForm';
import { ConfirmSignup } from '../../features/organization-signup/components/ConfirmSignup';
import { Notice, ErrorNotice } from '../../components/ui/Notice';
import { Loading } from '../../components/ui/Panel';
import { useDocumentTitle } from '../../lib/use-document-title';
import { CenteredShell } from '../layout/RootLayout';

export function StartOrganizationPage() {
  useDocumentTitle('Start an organization');
  const status = useSignupStatus();
  return (
    <CenteredShell>
      <h1 className="text-2xl font-bold">Start an organization</h1>
      <p className="mt-1 mb-6 text-sm text-ink-2">
        For a school, club or clinic that wants its own Loadline. You become its administrator and invite everyone else.
      </p>
      {status.isPending ? (
        <Loading what="this page" />
      ) : status.isError ? (
        <ErrorNotice error={status.error} />
      ) : status.data.open ? (
        <StartOrganizationForm />
      ) : (
        <Notice tone="info" role="status" title="Not on this installation">
          <p>
            Starting an organization is turned off here: this Loadline is run privately. Ask the people who run it to create your
            organization; they will send you an invitation link.
          </p>
        </Notice>
      )}
      <p className="mt-6 text-sm">
        <Link to="/sign-in">Back to sign in</Link>
      </p>
    </CenteredShell>
  );
}

export function ConfirmOrganizationPage() {
  useDocumentTitle('Confirm your e-mail');
  const location = useLocation();
  const navigate = useNavigate();
  return (
    <CenteredShell>
      <h1 className="text-2xl font-bold">Confirm your e-mail</h1>
      <div className="mt-4">
        {/* Leaving with replace drops the token-bearing address from the history. */}
        <ConfirmSignup
          hash={location.hash}
          onConfirmed={(done) => navigate('/sign-in', { replace: true, state: { organizationStarted: done } })}
        />
      </div>
    </CenteredShell>
  );
}
