import { useSession } from '../../features/auth/api/get-session';
import { AccountForm } from '../../features/account/components/AccountForm';
import { TwoStepSection } from '../../features/auth/components/TwoStepSection';
import { useTwoStepStatus } from '../../features/auth/api/two-step';
import { Facts, PageHeader, Panel } from '../../components/ui/Panel';
import { ROLE_LABELS, type Role } from '../../../../policies/roles';
import { useDocumentTitle } from '../../lib/use-document-title';
import { useContext } from 'react';
import { useAppAbility } from '../../lib/ability';
import { MembershipContext } from '../../lib/membership-context';
import { RecordExportPanel } from '../../features/record-export/components/RecordExportPanel';
import { CalendarFeedPanel } from '../../features/calendar-feed/components/CalendarFeedPanel';

const FEED_ROLES: Role[] = ['athlete', 'coach', 'guardian'];

export function AccountPage() {
  useDocumentTitle('Your account');
  const session = useSession();
  const current = useContext(MembershipContext);
  const ability = useAppAbility();
  const user = session.data?.user;
  if (!user) return null;
  const memberships = session.data?.memberships ?? [];
  // Offered to anyone who holds clinical or admin rights anywhere; shown to anyone who already has it on.
  const feedMemberships = memberships.filter((m) => m.roles.some((r) => FEED_ROLES.includes(r)));
  const offerTwoStep = memberships.some((m) => m.roles.includes('clinician') || m.roles.includes('admin'));

  return (
    <div className="max-w-3xl space-y-5">
      <PageHeader title="Your account">Your name and the unit you read loads in.</PageHeader>
      <Panel title="Profile">
        <div className="mb-4">
          <Facts items={[{ label: 'E-mail', value: user.email }]} />
        </div>
        <AccountForm user={user} />
      </Panel>
      {/* The athlete's own record, a guardian's minors': whoever the rules let ask in this organization. */}
      {current && ability.can('create', 'RecordExport') ? <RecordExportPanel orgId={current.orgId} /> : null}
      {offerTwoStep ? <TwoStepSection /> : <TwoStepIfOn />}
      {/* Athletes and coaches have a training calendar, guardians their athletes'; one feed per organization. */}
      {feedMemberships.map((m) => (
        <CalendarFeedPanel
          key={m.id}
          orgId={m.organizationId}
          organizationName={feedMemberships.length > 1 ? m.organizationName : undefined}
          timeZone={m.timeZone}
          roles={m.roles}
        />
      ))}
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

/** For other roles the section appears only when two-step sign-in is already on, so it can be turned off. */
function TwoStepIfOn() {
  const status = useTwoStepStatus();
  return status.data?.enabled ? <TwoStepSection /> : null;
}
