import { Link } from 'react-router-dom';
import { useCheckIns } from '../../../features/check-ins/api/get-check-ins';
import { CheckInForm } from '../../../features/check-ins/components/CheckInForm';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Loading, PageHeader } from '../../../components/ui/Panel';
import { todayLocal } from '../../../lib/dates';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';
import { RoleGate } from '../../layout/RoleGate';
import { ATHLETE_HOME } from './paths';

export function CheckInPage() {
  useDocumentTitle('Daily check-in');
  return (
    <RoleGate role="athlete">
      <CheckIn />
    </RoleGate>
  );
}

function CheckIn() {
  const { orgId, membership } = useCurrentMembership();
  const today = todayLocal();
  const existing = useCheckIns(orgId, membership.id, { from: today, to: today });
  const todays = existing.data?.find((c) => c.date === today);

  return (
    <div className="mx-auto max-w-xl space-y-5">
      <p className="text-sm">
        <Link to={ATHLETE_HOME}>← My page</Link>
      </p>
      <PageHeader title="Daily check-in">How you slept and how you feel today. Four taps and one button.</PageHeader>
      {existing.isPending ? (
        <Loading what="today's check-in" />
      ) : (
        <>
          {existing.isError && <ErrorNotice error={existing.error} title="Today's earlier answers could not be loaded" />}
          <CheckInForm key={todays?.id ?? 'new'} orgId={orgId} athleteId={membership.id} date={today} existing={todays} />
        </>
      )}
    </div>
  );
}
