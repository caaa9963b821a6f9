import { useId } from 'react';
import { useAthletes } from '../../features/athletes/api/get-athletes';
import { AthleteCard } from '../../features/athletes/components/AthleteCard';
import { useLetters } from '../../features/letters/api/get-letters';
import { FamilyLetters } from '../../features/letters/components/FamilyLetters';
import { LastUpdatedNote } from '../../features/offline/components/LastUpdatedNote';
import { FamilyClips } from '../../features/clips/components/ClipsSection';
import { useOrganization } from '../../features/organization/api/get-organization';
import { isNoAccess, useInForce } from '../../features/plans/api/get-in-force';
import { StatusToday, TodayLimits } from '../../features/plans/components/TodayLimits';
import { NextStageUnlocks } from '../../features/stage-criteria/components/NextStageUnlocks';
import { RedFlagCaution } from '../../components/Cautions';
import { ErrorNotice } from '../../components/ui/Notice';
import { Loading, PageHeader } from '../../components/ui/Panel';
import { todayLocal } from '../../lib/dates';
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
  // The same cache entry the letters below read: only to tell whether the page comes from the last visit.
  const letters = useLetters(orgId, null);
  const mine = (athletes.data ?? []).filter((a) => a.guardians.some((g) => g.guardianId === membership.id));

  return (
    <div className="mx-auto max-w-xl space-y-5">
      <PageHeader title={mine.length > 1 ? 'Your athletes' : 'Your athlete'}>
        The athletes you are linked to as parent or guardian at {membership.organizationName}.
      </PageHeader>
      <LastUpdatedNote queries={[athletes, letters]} audience="family" />
      {athletes.isPending ? (
        <Loading what="your athletes" />
      ) : athletes.isError && !athletes.data ? (
        <ErrorNotice error={athletes.error} />
      ) : mine.length === 0 ? (
        <p className="rounded-lg border border-rule bg-sheet p-4 text-sm">
          No athlete is linked to you yet. The organization&apos;s administrator links guardians to athletes.
        </p>
      ) : (
        mine.map((athlete) => <WardToday key={athlete.id} athleteId={athlete.id} name={firstName(athlete.displayName)} />)
      )}
      {mine.length > 0 && (
        <FamilyLetters
          orgId={orgId}
          guardianId={membership.id}
          athletes={mine.map((a) => ({ id: a.id, name: firstName(a.displayName) }))}
        />
      )}
      {mine.map((athlete) => (
        <FamilyClips key={athlete.id} orgId={orgId} athleteId={athlete.id} name={firstName(athlete.displayName)} />
      ))}
      <RedFlagCaution emergencyNumber={organization.data?.emergencyNumber} />
      {mine.map((athlete) => (
        <AthleteCard key={athlete.id} athlete={athlete} />
      ))}
    </div>
  );
}

function firstName(displayName: string): string {
  return displayName.split(/\s+/)[0] || displayName;
}

/** The athlete's status and limits in plain words; left out when the guardian has no view of them. */
function WardToday({ athleteId, name }: { athleteId: string; name: string }) {
  const { orgId, user } = useCurrentMembership();
  const inForce = useInForce(orgId, athleteId, todayLocal());
  const headingId = useId();
  if (inForce.isPending) return <Loading what={`${name}'s limits`} />;
  if (inForce.isError && !inForce.data) return isNoAccess(inForce.error) ? null : <ErrorNotice error={inForce.error} />;
  return (
    <>
      <section aria-labelledby={headingId} className="rounded-lg border border-rule bg-sheet p-4 sm:p-5">
        <h2 id={headingId} className="mb-2 text-xl font-bold">
          {name}&apos;s status
        </h2>
        <StatusToday inForce={inForce.data} name={name} />
      </section>
      <TodayLimits inForce={inForce.data} unit={user.unitPref} name={name} />
      {inForce.data.stages.map((s) => (
        <NextStageUnlocks key={s.planId} orgId={orgId} planId={s.planId} name={name} />
      ))}
    </>
  );
}
