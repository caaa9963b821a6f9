import { useAthlete } from '../../features/athletes/api/get-athlete';
import { AthleteCard } from '../../features/athletes/components/AthleteCard';
import { useOrganization } from '../../features/organization/api/get-organization';
import { RedFlagCaution } from '../../components/Cautions';
import { ErrorNotice } from '../../components/ui/Notice';
import { ComingLater, Loading, PageHeader } from '../../components/ui/Panel';
import { useCurrentMembership } from '../../lib/membership-context';
import { useDocumentTitle } from '../../lib/use-document-title';
import { RoleGate } from '../layout/RoleGate';

export function AthleteHome() {
  useDocumentTitle('My profile');
  return (
    <RoleGate role="athlete">
      <AthleteProfile />
    </RoleGate>
  );
}

function AthleteProfile() {
  const { orgId, membership } = useCurrentMembership();
  const athlete = useAthlete(orgId, membership.id);
  const organization = useOrganization(orgId);

  return (
    <div className="mx-auto max-w-xl space-y-5">
      <PageHeader title="My profile">What {membership.organizationName} has on record for you, and who looks after you.</PageHeader>
      <RedFlagCaution emergencyNumber={organization.data?.emergencyNumber} />
      {athlete.isPending ? (
        <Loading what="your profile" />
      ) : athlete.isError ? (
        <ErrorNotice error={athlete.error} />
      ) : (
        <AthleteCard athlete={athlete.data} self />
      )}
      <ComingLater title="Pain reports and training logs arrive in a coming release">
        <p>
          Soon you will report pain here, see what you may do today, and log each session. Until then, tell your
          clinician or coach about any pain in person, straight away.
        </p>
      </ComingLater>
    </div>
  );
}
