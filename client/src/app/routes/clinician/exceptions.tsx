import type { ProgramSessionDto } from '../../../../../policies/dto';
import { ExceptionRequests } from '../../../features/exceptions/components/ExceptionRequests';
import { useSessionBreaches } from '../../../features/programs/api/use-session-breaches';
import { PageHeader } from '../../../components/ui/Panel';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';

function useClinicianBreaches(athleteId: string, session: ProgramSessionDto | undefined) {
  const { orgId, user } = useCurrentMembership();
  return useSessionBreaches(orgId, user.unitPref, athleteId, session);
}

/**
 * Exception requests for the clinician to decide. The breaches beside each set come from the
 * programs feature's check, handed in here so the two features stay apart.
 */
export function ClinicianExceptionsPage() {
  useDocumentTitle('Exception requests');
  const { orgId, user } = useCurrentMembership();
  return (
    <div className="space-y-4">
      <PageHeader title="Exception requests">
        A coach asks when a planned set would go past a cap you set. Grant all of it, only some sets, or refuse — with a note. Both the
        request and your decision go on the audit trail.
      </PageHeader>
      <ExceptionRequests orgId={orgId} unit={user.unitPref} useBreaches={useClinicianBreaches} />
    </div>
  );
}
