import { useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import type { TrainingLogOutcomeDto } from '../../../../../policies/dto';
import { useInForce } from '../../../features/plans/api/get-in-force';
import { useToday } from '../../../features/programs/api/get-today';
import { setsFromPlan } from '../../../features/training-logs/components/from-plan';
import { LogOutcome } from '../../../features/training-logs/components/LogOutcome';
import { TrainingLogForm } from '../../../features/training-logs/components/TrainingLogForm';
import { Button, ButtonLink } from '../../../components/ui/Button';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Loading, PageHeader } from '../../../components/ui/Panel';
import { todayLocal } from '../../../lib/dates';
import { formatDate } from '../../../lib/format';
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

const ISO_DAY = /^\d{4}-\d{2}-\d{2}$/;

function LogSession() {
  const { orgId, membership, user } = useCurrentMembership();
  // A ceiling the clinician set marks the pain scores past it; with no plan in force there is none to show.
  const inForce = useInForce(orgId, membership.id, todayLocal());
  const [params] = useSearchParams();
  const sessionId = params.get('session');
  const rawDate = params.get('date');
  const plannedDate = rawDate && ISO_DAY.test(rawDate) ? rawDate : todayLocal();
  // 'kept': Loadline could not be reached and the log waits on the phone (lib/offline-queue.ts).
  const [outcome, setOutcome] = useState<TrainingLogOutcomeDto | 'kept' | null>(null);
  const another = () => {
    setOutcome(null);
    setRound((r) => r + 1);
  };
  const kept = () => {
    setOutcome('kept');
    window.scrollTo({ top: 0 });
  };
  const [round, setRound] = useState(0);

  return (
    <div className="mx-auto max-w-xl space-y-5">
      <p className="text-sm">
        <Link to={sessionId ? ATHLETE_WEEK : ATHLETE_HOME}>{sessionId ? '← My week' : '← My page'}</Link>
      </p>
      <PageHeader title="Log a session">
        What you did and how it felt. Your pain answers are checked against the ceiling your clinician set.
      </PageHeader>
      {outcome === 'kept' ? (
        <Notice tone="info" role="status" title="Saved on this phone">
          <p>
            Loadline can&apos;t be reached right now. Your session is sent as soon as it can be, in the order you logged it; your page shows
            it until then.
          </p>
          <div className="mt-3 flex flex-wrap gap-2">
            <ButtonLink to={ATHLETE_HOME}>Back to my page</ButtonLink>
            <Button variant="secondary" onClick={another}>
              Log another session
            </Button>
          </div>
        </Notice>
      ) : outcome ? (
        <LogOutcome outcome={outcome} homeHref={ATHLETE_HOME} weekHref={ATHLETE_WEEK} onAnother={another} />
      ) : sessionId && round === 0 ? (
        <FromPlan
          orgId={orgId}
          athleteId={membership.id}
          sessionId={sessionId}
          date={plannedDate}
          unit={user.unitPref}
          painCeiling={inForce.data?.stages.length ? inForce.data.painCeiling : undefined}
          onSaved={setOutcome}
          onKept={kept}
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
          onKept={kept}
        />
      )}
    </div>
  );
}

/** "Log this session": the form pre-filled from the planned session, to be edited to what was done. */
function FromPlan({
  orgId,
  athleteId,
  sessionId,
  date,
  unit,
  painCeiling,
  onSaved,
  onKept,
}: {
  orgId: string;
  athleteId: string;
  sessionId: string;
  date: string;
  unit: 'kg' | 'lb';
  painCeiling: number | undefined;
  onSaved: (outcome: TrainingLogOutcomeDto) => void;
  onKept: () => void;
}) {
  const day = useToday(orgId, athleteId, date);
  if (day.isPending) return <Loading what="the planned session" />;
  // Without signal, the copy kept from the last visit still serves (lib/offline-copy.ts).
  if (day.isError && !day.data) return <ErrorNotice error={day.error} title="The planned session is not available" />;
  const session = day.data.sessions.find((s) => s.id === sessionId);
  if (!session || session.onHold) {
    return (
      <Notice tone="caution" title="This session can't be logged from the plan">
        <p>
          {session
            ? 'It is on hold until your coach updates it.'
            : `It is not among your sessions of ${formatDate(date)}. You can still log what you did with "Log a session".`}
        </p>
      </Notice>
    );
  }
  return (
    <>
      <Notice title={`From your plan: ${session.title}, ${formatDate(session.date)}`}>
        <p>The planned sets are filled in. Change them to what you actually did: the load, the reps, or remove and add sets.</p>
      </Notice>
      <TrainingLogForm
        orgId={orgId}
        athleteId={athleteId}
        unit={unit}
        painCeiling={painCeiling}
        plan={{ sessionId: session.id, sets: setsFromPlan(session, unit) }}
        onSaved={(saved) => {
          onSaved(saved);
          window.scrollTo({ top: 0 });
        }}
        onKept={onKept}
      />
    </>
  );
}
