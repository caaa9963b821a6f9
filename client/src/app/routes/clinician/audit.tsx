import { AuditTrail } from '../../../features/audit/components/AuditTrail';
import { useCaseload } from '../../../features/caseload/api/get-caseload';
import { PageHeader } from '../../../components/ui/Panel';
import { useAppAbility } from '../../../lib/ability';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';

export function ClinicianAuditPage() {
  useDocumentTitle('Audit trail');
  const { orgId, membership } = useCurrentMembership();
  const ability = useAppAbility();
  const caseload = useCaseload(orgId);
  const athletes = (caseload.data ?? [])
    .filter((r) => membership.actor.clinicianOf.includes(r.athleteId))
    .map((r) => ({ id: r.athleteId, name: r.athleteName }));
  return (
    <div className="space-y-4">
      <PageHeader title="Audit trail">
        Every change to the records of the athletes in your care — who made it, when, and what it was before and after. Entries cannot be
        edited or deleted, and clinical notes are never copied into them.
      </PageHeader>
      <AuditTrail orgId={orgId} athletes={athletes} canVerify={ability.can('read', 'AuditChain')} />
    </div>
  );
}
