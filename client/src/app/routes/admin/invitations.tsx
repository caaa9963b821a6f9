import { InviteForm } from '../../../features/invitations/components/InviteForm';
import { InvitationList } from '../../../features/invitations/components/InvitationList';
import { PageHeader, Panel } from '../../../components/ui/Panel';
import { useAppAbility } from '../../../lib/ability';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';

export function InvitationsPage() {
  useDocumentTitle('Invitations');
  const { orgId, membership } = useCurrentMembership();
  const ability = useAppAbility();
  return (
    <div className="space-y-5">
      <PageHeader title="Invitations">
        People join {membership.organizationName} by invitation only. Each invitation is e-mailed to the person invited; its link works once
        and expires.
      </PageHeader>
      {ability.can('create', 'Invitation') && (
        <Panel title="Invite someone">
          <InviteForm orgId={orgId} />
        </Panel>
      )}
      <Panel title="Pending invitations">
        <InvitationList orgId={orgId} show="pending" />
      </Panel>
      <Panel title="Earlier invitations">
        <InvitationList orgId={orgId} show="closed" />
      </Panel>
    </div>
  );
}
