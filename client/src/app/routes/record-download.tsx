import { Link, useLocation, useSearchParams } from 'react-router-dom';
import { useSession } from '../../features/auth/api/get-session';
import { RecordDownload } from '../../features/record-export/components/RecordDownload';
import { Notice } from '../../components/ui/Notice';
import { buttonClass } from '../../components/ui/Button';
import { useDocumentTitle } from '../../lib/use-document-title';
import { CenteredShell } from '../layout/RootLayout';

/**
 * Where an e-mailed record link lands. The code rides in the fragment (#…), which never reaches the
 * server; the page sends it in a POST body. Signed out, it offers sign-in and comes back here with the
 * fragment kept, since only the person who asked may download.
 */
export function RecordDownloadPage() {
  useDocumentTitle('Download a record');
  const session = useSession();
  const location = useLocation();
  const [search] = useSearchParams();
  const orgId = search.get('org') ?? '';
  const token = location.hash.replace(/^#/, '');
  const wellFormed = /^[0-9a-f-]{36}$/.test(orgId) && /^[A-Za-z0-9_-]{43}$/.test(token);

  return (
    <CenteredShell>
      <h1 className="text-2xl font-bold">Download a record</h1>
      <div className="mt-6">
        {!wellFormed ? (
          <Notice tone="problem" title="This link is incomplete">
            <p>Open the link from the e-mail again, whole. If it still does not work, ask for a new copy on your account page.</p>
          </Notice>
        ) : !session.data?.user ? (
          <div className="space-y-4">
            <p className="text-sm text-ink-2">Sign in as the person who asked for the copy; you will come back here.</p>
            <Link
              to="/sign-in"
              state={{ from: `${location.pathname}${location.search}${location.hash}` }}
              className={buttonClass('primary', 'lg')}
            >
              Sign in
            </Link>
          </div>
        ) : (
          <RecordDownload orgId={orgId} token={token} />
        )}
      </div>
    </CenteredShell>
  );
}
