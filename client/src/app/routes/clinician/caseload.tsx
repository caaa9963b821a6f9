import { useCaseload } from '../../../features/caseload/api/get-caseload';
import { CaseloadTable } from '../../../features/caseload/components/CaseloadTable';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Loading, PageHeader } from '../../../components/ui/Panel';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';
import { clinicianAthleteHref } from './paths';

export function ClinicianHome() {
  useDocumentTitle('My caseload');
  const { orgId, membership } = useCurrentMembership();
  const caseload = useCaseload(orgId);
  // An admin who is also a clinician is sent everyone; the caseload is the athletes in their care.
  const mine = (caseload.data ?? []).filter((r) => membership.actor.clinicianOf.includes(r.athleteId));

  return (
    <div className="space-y-5">
      <PageHeader title="My caseload">
        Athletes whose care team you are on as their clinician: who is Out or Limited, since when, and when each is due for review.
      </PageHeader>
      {caseload.isPending ? (
        <Loading what="your caseload" />
      ) : caseload.isError ? (
        <ErrorNotice error={caseload.error} />
      ) : (
        <CaseloadTable
          rows={mine}
          clinical
          caption="Athletes in your care"
          empty="You are not on any athlete's care team yet. Your organization's administrator adds clinicians to care teams."
          athleteHref={clinicianAthleteHref}
        />
      )}
    </div>
  );
}
