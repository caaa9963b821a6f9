import { useSession } from '../../features/auth/api/get-session';
import { AccountForm } from '../../features/account/components/AccountForm';
import { Facts, PageHeader, Panel } from '../../components/ui/Panel';
import { ROLE_LABELS } from '../../../../policies/roles';
import { useDocumentTitle } from '../../lib/use-document-title';

export function AccountPage() {
  useDocumentTitle('Your account');
  const session = useSession();
  const user = session.data?.user;
  if (!user) return null;
  const memberships = session.data?.memberships ?? [];

  return (
    <div className="max-w-3xl space-y-5">
      <PageHeader title="Your account">Your name and the unit you read loads in.</PageHeader>
      <Panel title="Profile">
        <div className="mb-4">
          <Facts items={[{ label: 'E-mail', value: user.email }]} />
        </div>
        <AccountForm user={user} />
      </Panel>
      <Panel title="Organizations">
        {memberships.length === 0 ? (
          <p className="text-sm text-ink-2">You are not part of any organization.</p>
        ) : (
          <ul className="space-y-1 text-sm">
            {memberships.map((m) => (
              <li key={m.id}>
                <span className="font-semibold">{m.organizationName}</span>{' '}
                <span className="text-ink-2">· {m.roles.map((r) => ROLE_LABELS[r]).join(', ')}</span>
              </li>
            ))}
          </ul>
        )}
      </Panel>
    </div>
  );
}
