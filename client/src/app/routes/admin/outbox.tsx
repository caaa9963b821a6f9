import { OutboxList } from '../../../features/outbox/components/OutboxList';
import { DeliveryTable } from '../../../features/outbox/components/DeliveryTable';
import { PageHeader } from '../../../components/ui/Panel';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';

export function OutboxPage() {
  useDocumentTitle('Outbox');
  const { orgId } = useCurrentMembership();
  return (
    <div className="space-y-4">
      <PageHeader title="Outbox">
        Every e-mail Loadline sent or is trying to send, with its state (a failure shows its reason), and what the local test mail server
        received.
      </PageHeader>
      <h2 className="text-lg font-bold">Deliveries</h2>
      <DeliveryTable orgId={orgId} />
      <h2 className="text-lg font-bold">Received by the local test mail server</h2>
      <OutboxList orgId={orgId} />
    </div>
  );
}
