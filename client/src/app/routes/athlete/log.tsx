import { useState } from 'react';
import { Link } from 'react-router-dom';
import type { TrainingLogOutcomeDto } from '../../../../../policies/dto';
import { useInForce } from '../../../features/plans/api/get-in-force';
import { LogOutcome } from '../../../features/training-logs/components/LogOutcome';
import { TrainingLogForm } from '../../../features/training-logs/components/TrainingLogForm';
import { PageHeader } from '../../../components/ui/Panel';
import { todayLocal } from '../../../lib/dates';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';
import { RoleGate } from '../../layout/RoleGate';
import { ATHLETE_HOME, ATHLETE_WEEK } from './paths';

export function LogSessionPage() {
  useDocumentTitle('Log a session');
  return (
    <RoleGate role="athlete">
      <LogSession />
    </RoleGate>
  );
}

function LogSession() {
  const { orgId, membership, user } = useCurrentMembership();
  // A ceiling the clinician set marks the pain scores past it; with no plan in force there is none to show.
  const inForce = useInForce(orgId, membership.id, todayLocal());
  const [outcome, setOutcome] = useState<TrainingLogOutcomeDto | null>(null);
  const [round, setRound] = useState(0);

  return (
    <div className="mx-auto max-w-xl space-y-5">
      <p className="text-sm">
        <Link to={ATHLETE_HOME}>← My page</Link>
      </p>
      <PageHeader title="Log a session">
        What you did and how it felt. Your pain answers are checked against the ceiling your clinician set.
      </PageHeader>
      {outcome ? (
        <LogOutcome
          outcome={outcome}
          homeHref={ATHLETE_HOME}
          weekHref={ATHLETE_WEEK}
          onAnother={() => {
            setOutcome(null);
            setRound((r) => r + 1);
          }}
        />
      ) : (
        <TrainingLogForm
          key={round}
          orgId={orgId}
          athleteId={membership.id}
          unit={user.unitPref}
          painCeiling={inForce.data?.stages.length ? inForce.data.painCeiling : undefined}
          onSaved={(saved) => {
            setOutcome(saved);
            window.scrollTo({ top: 0 });
          }}
        />
      )}
    </div>
  );
}
