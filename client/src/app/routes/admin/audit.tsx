import { AuditTrail } from '../../../features/audit/components/AuditTrail';
import { useAthletes } from '../../../features/athletes/api/get-athletes';
import { PageHeader } from '../../../components/ui/Panel';
import { useAppAbility } from '../../../lib/ability';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';

export function AuditPage() {
  useDocumentTitle('Audit trail');
  const { orgId } = useCurrentMembership();
  const ability = useAppAbility();
  const athletes = useAthletes(orgId);
  const options = (athletes.data ?? []).map((a) => ({ id: a.id, name: a.displayName })).sort((a, b) => a.name.localeCompare(b.name));
  return (
    <div className="space-y-4">
      <PageHeader title="Audit trail">
        Every change — who made it, when, and what it was before and after. Entries cannot be edited or deleted.
      </PageHeader>
      <AuditTrail orgId={orgId} athletes={options} canVerify={ability.can('read', 'AuditChain')} />
    </div>
  );
}
