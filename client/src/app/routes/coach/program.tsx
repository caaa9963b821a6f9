import { useParams } from 'react-router-dom';
import { ProgramBuilder } from '../../../features/programs/components/ProgramBuilder';
import { useCurrentMembership } from '../../../lib/membership-context';
import { RoleGate } from '../../layout/RoleGate';

/** One program: its weeks and the session editor, checked live against each athlete's limits. */
export function CoachProgramPage() {
  return (
    <RoleGate role="coach">
      <Program />
    </RoleGate>
  );
}

function Program() {
  const { programId = '' } = useParams();
  const { orgId, user } = useCurrentMembership();
  return (
    <ProgramBuilder
      key={programId}
      orgId={orgId}
      programId={programId}
      unit={user.unitPref}
      backTo={{ href: '/coach', label: 'My athletes' }}
    />
  );
}
