import { useRoster } from '../../features/programs/api/get-roster';
import { NewProgram } from '../../features/programs/components/NewProgramForm';
import { RosterTable } from '../../features/programs/components/RosterTable';
import { TeamProgramList } from '../../features/team-programs/components/TeamProgramList';
import { ButtonLink } from '../../components/ui/Button';
import { ErrorNotice } from '../../components/ui/Notice';
import { Loading, PageHeader } from '../../components/ui/Panel';
import { useCurrentMembership } from '../../lib/membership-context';
import { useDocumentTitle } from '../../lib/use-document-title';
import { RoleGate } from '../layout/RoleGate';
import { STAFF_FLAGS } from './staff/paths';

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
  const roster = useRoster(orgId);
  // An admin who also coaches is sent everyone; this page is the athletes they coach.
  const mine = (roster.data ?? []).filter((r) => membership.actor.coachOf.includes(r.athleteId));
  return (
    <div className="space-y-5">
      <PageHeader
        title="My athletes"
        actions={
          <>
            <ButtonLink to="/coach/exercises" variant="secondary">
              Exercise library
            </ButtonLink>
            <ButtonLink to={STAFF_FLAGS} variant="secondary">
              Flags
            </ButtonLink>
          </>
        }
      >
        Athletes whose care team you are on as their coach: who is limited today, which sessions are on hold, and what waits for a
        clinician. Open an athlete for their limits, programs and 1RMs.
      </PageHeader>
      <NewProgram orgId={orgId} athletes={mine.map((r) => ({ id: r.athleteId, name: r.athleteName }))} />
      {roster.isPending ? (
        <Loading what="athletes" />
      ) : roster.isError ? (
        <ErrorNotice error={roster.error} />
      ) : (
        <RosterTable
          rows={mine}
          caption="Athletes you coach"
          empty="You are not on any athlete's care team yet. Your organization's administrator adds coaches to care teams."
          athleteHref={coachAthleteHref}
        />
      )}
      <TeamProgramList orgId={orgId} />
    </div>
  );
}
