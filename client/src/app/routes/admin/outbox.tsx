import { OutboxList } from '../../../features/outbox/components/OutboxList';
import { PageHeader } from '../../../components/ui/Panel';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';

export function OutboxPage() {
  useDocumentTitle('Outbox');
  const { orgId } = useCurrentMembership();
  return (
    <div className="space-y-4">
      <PageHeader title="Outbox">
        The e-mails Loadline sent, as the local test mail server received them: invitations and signed clearance letters.
      </PageHeader>
      <OutboxList orgId={orgId} />
    </div>
  );
}
