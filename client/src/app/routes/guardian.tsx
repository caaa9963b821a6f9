import { useAthletes } from '../../features/athletes/api/get-athletes';
import { AthleteCard } from '../../features/athletes/components/AthleteCard';
import { useOrganization } from '../../features/organization/api/get-organization';
import { RedFlagCaution } from '../../components/Cautions';
import { ErrorNotice } from '../../components/ui/Notice';
import { ComingLater, Loading, PageHeader } from '../../components/ui/Panel';
import { useCurrentMembership } from '../../lib/membership-context';
import { useDocumentTitle } from '../../lib/use-document-title';
import { RoleGate } from '../layout/RoleGate';

export function GuardianHome() {
  useDocumentTitle('Your athlete');
  return (
    <RoleGate role="guardian">
      <Wards />
    </RoleGate>
  );
}

function Wards() {
  const { orgId, membership } = useCurrentMembership();
  const athletes = useAthletes(orgId);
  const organization = useOrganization(orgId);
  const mine = (athletes.data ?? []).filter((a) => a.guardians.some((g) => g.guardianId === membership.id));

  return (
    <div className="mx-auto max-w-xl space-y-5">
      <PageHeader title={mine.length > 1 ? 'Your athletes' : 'Your athlete'}>
        The athletes you are linked to as parent or guardian at {membership.organizationName}.
      </PageHeader>
      <RedFlagCaution emergencyNumber={organization.data?.emergencyNumber} />
      {athletes.isPending ? (
        <Loading what="your athletes" />
      ) : athletes.isError ? (
        <ErrorNotice error={athletes.error} />
      ) : mine.length === 0 ? (
        <p className="rounded-lg border border-rule bg-sheet p-4 text-sm">
          No athlete is linked to you yet. The organization&apos;s administrator links guardians to athletes.
        </p>
      ) : (
        mine.map((athlete) => <AthleteCard key={athlete.id} athlete={athlete} />)
      )}
      <ComingLater title="Clearance letters arrive in a coming release">
        <p>
          You will be told here, in plain words, what your athlete may do and until when, and you will receive and
          acknowledge clearance letters. Until then, the care team will contact you directly.
        </p>
      </ComingLater>
    </div>
  );
}
