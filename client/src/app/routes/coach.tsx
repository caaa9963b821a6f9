import { useCaseload } from '../../features/caseload/api/get-caseload';
import { CaseloadTable } from '../../features/caseload/components/CaseloadTable';
import { ErrorNotice } from '../../components/ui/Notice';
import { ComingLater, Loading, PageHeader } from '../../components/ui/Panel';
import { useCurrentMembership } from '../../lib/membership-context';
import { useDocumentTitle } from '../../lib/use-document-title';
import { RoleGate } from '../layout/RoleGate';
import { MarksLegend } from './legend';

export const coachAthleteHref = (athleteId: string) => `/coach/athletes/${athleteId}`;

export function CoachHome() {
  useDocumentTitle('My athletes');
  return (
    <RoleGate role="coach">
      <CoachRoster />
    </RoleGate>
  );
}

function CoachRoster() {
  const { orgId, membership } = useCurrentMembership();
  const caseload = useCaseload(orgId);
  // An admin who also coaches is sent everyone; this page is the athletes they coach.
  const mine = (caseload.data ?? []).filter((r) => membership.actor.coachOf.includes(r.athleteId));
  return (
    <div className="space-y-5">
      <PageHeader title="My athletes">
        Athletes whose care team you are on as their coach. Open an athlete to see the limits their clinician set.
      </PageHeader>
      {caseload.isPending ? (
        <Loading what="athletes" />
      ) : caseload.isError ? (
        <ErrorNotice error={caseload.error} />
      ) : (
        <CaseloadTable
          rows={mine}
          caption="Athletes you coach"
          empty="You are not on any athlete's care team yet. Your organization's administrator adds coaches to care teams."
          athleteHref={coachAthleteHref}
        />
      )}
      <ComingLater title="Programs arrive in a coming release">
        <p>
          Writing programs, and checking every planned set against these limits, come next. Until then, program by hand
          under the limits on each athlete&apos;s page.
        </p>
        <MarksLegend />
      </ComingLater>
    </div>
  );
}
