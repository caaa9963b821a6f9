import { AuditTrail } from '../../../features/audit/components/AuditTrail';
import { PageHeader } from '../../../components/ui/Panel';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';

export function AuditPage() {
  useDocumentTitle('Audit trail');
  const { orgId } = useCurrentMembership();
  return (
    <div className="space-y-4">
      <PageHeader title="Audit trail">
        Every change — who made it, when, and what it was before and after. Entries cannot be edited or deleted.
      </PageHeader>
      <AuditTrail orgId={orgId} />
    </div>
  );
}
