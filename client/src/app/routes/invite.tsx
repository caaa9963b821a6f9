import { useLocation, useNavigate } from 'react-router-dom';
import { useSession } from '../../features/auth/api/get-session';
import { AcceptInvitation } from '../../features/invitations/components/AcceptInvitation';
import { Notice } from '../../components/ui/Notice';
import { useDocumentTitle } from '../../lib/use-document-title';
import { CenteredShell } from '../layout/RootLayout';

export function InvitePage() {
  useDocumentTitle('Accept invitation');
  const location = useLocation();
  const navigate = useNavigate();
  const session = useSession();
  const signedInAs = session.data?.user;

  return (
    <CenteredShell>
      <h1 className="text-2xl font-bold">Accept your invitation</h1>
      <p className="mt-1 mb-6 text-sm text-ink-2">Join your organization&apos;s care team on Loadline.</p>
      {signedInAs && (
        <Notice tone="info" className="mb-4">
          <p>You are signed in as {signedInAs.email}. Accepting signs you in as the invited person instead.</p>
        </Notice>
      )}
      {/* Leaving with replace drops the token-bearing address from the history. */}
      <AcceptInvitation hash={location.hash} onAccepted={() => navigate('/', { replace: true })} />
    </CenteredShell>
  );
}
