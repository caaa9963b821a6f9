import { useParams } from 'react-router-dom';
import { TeamProgramScreen } from '../../../features/team-programs/components/TeamProgramScreen';
import { TeamVersionScreen } from '../../../features/team-programs/components/TeamVersionScreen';
import { useCurrentMembership } from '../../../lib/membership-context';
import { RoleGate } from '../../layout/RoleGate';

/** A team program: write each session once, review every athlete's fitted version, publish to the group. */
export function CoachTeamProgramPage() {
  return (
    <RoleGate role="coach">
      <TeamProgram />
    </RoleGate>
  );
}

function TeamProgram() {
  const { programId = '' } = useParams();
  const { orgId, user } = useCurrentMembership();
  return <TeamProgramScreen key={programId} orgId={orgId} programId={programId} unit={user.unitPref} />;
}

/** One athlete's version of a team session, line by line, with the coach's decisions. */
export function CoachTeamVersionPage() {
  return (
    <RoleGate role="coach">
      <TeamVersion />
    </RoleGate>
  );
}

function TeamVersion() {
  const { programId = '', sessionId = '', athleteId = '' } = useParams();
  const { orgId, user } = useCurrentMembership();
  return (
    <TeamVersionScreen
      key={`${sessionId}:${athleteId}`}
      orgId={orgId}
      programId={programId}
      teamSessionId={sessionId}
      athleteId={athleteId}
      unit={user.unitPref}
    />
  );
}
