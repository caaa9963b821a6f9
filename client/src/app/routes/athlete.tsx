import { useAthlete } from '../../features/athletes/api/get-athlete';
import { AthleteCard } from '../../features/athletes/components/AthleteCard';
import { useLetters } from '../../features/letters/api/get-letters';
import { CurrentLetter } from '../../features/letters/components/CurrentLetter';
import { useOrganization } from '../../features/organization/api/get-organization';
import { isNoAccess, useInForce } from '../../features/plans/api/get-in-force';
import { StatusToday, TodayLimits } from '../../features/plans/components/TodayLimits';
import { NextStageUnlocks } from '../../features/stage-criteria/components/NextStageUnlocks';
import { TodaySessions } from '../../features/programs/components/TodaySessions';
import { RedFlagCaution } from '../../components/Cautions';
import { ErrorNotice } from '../../components/ui/Notice';
import { Loading, PageHeader, Panel } from '../../components/ui/Panel';
import { todayLocal } from '../../lib/dates';
import { useCurrentMembership } from '../../lib/membership-context';
import { useDocumentTitle } from '../../lib/use-document-title';
import { RoleGate } from '../layout/RoleGate';
import { AthleteActions } from './athlete/AthleteActions';
import { LastUpdatedNote } from '../../features/offline/components/LastUpdatedNote';
import { OutboxPanel } from '../../features/offline/components/OutboxPanel';
import { useToday } from '../../features/programs/api/get-today';

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
  // The same cache entries the sections below read: only to tell whether they come from the last visit.
  const today = useToday(orgId, membership.id, todayLocal());
  const inForce = useInForce(orgId, membership.id, todayLocal());
  const letters = useLetters(orgId, membership.id);

  return (
    <div className="mx-auto max-w-xl space-y-5">
      <PageHeader title="My profile">What {membership.organizationName} has on record for you, and who looks after you.</PageHeader>
      <LastUpdatedNote queries={[today, inForce, athlete, letters]} />
      <OutboxPanel />
      <AthleteActions orgId={orgId} athleteId={membership.id} />
      <TodaySessions athleteId={membership.id} />
      <MyToday athleteId={membership.id} />
      <Panel title="My clearance letter">
        <CurrentLetter orgId={orgId} athleteId={membership.id} audience="athlete" />
      </Panel>
      <RedFlagCaution emergencyNumber={organization.data?.emergencyNumber} />
      {athlete.isPending ? (
        <Loading what="your profile" />
      ) : athlete.isError && !athlete.data ? (
        <ErrorNotice error={athlete.error} />
      ) : (
        <AthleteCard athlete={athlete.data} self />
      )}
    </div>
  );
}

/** Status and today's limits. Without access to them (no answer, or refused), the section stays out. */
function MyToday({ athleteId }: { athleteId: string }) {
  const { orgId, user } = useCurrentMembership();
  const inForce = useInForce(orgId, athleteId, todayLocal());
  if (inForce.isPending) return <Loading what="what you may do today" />;
  if (inForce.isError && !inForce.data) return isNoAccess(inForce.error) ? null : <ErrorNotice error={inForce.error} />;
  return (
    <>
      <section aria-label="My status" className="rounded-lg border border-rule bg-sheet p-4 sm:p-5">
        <StatusToday inForce={inForce.data} />
      </section>
      <TodayLimits inForce={inForce.data} unit={user.unitPref} />
      {inForce.data.stages.map((s) => (
        <NextStageUnlocks key={s.planId} orgId={orgId} planId={s.planId} />
      ))}
    </>
  );
}
