import type { ExceptionDto, ProgramSessionDto } from '../../../../../policies/dto';
import type { Breach } from '../../../../../policies/load/compliance';
import type { Unit } from '../../../../../policies/schemas';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Loading } from '../../../components/ui/Panel';
import { useExceptionRequests } from '../api/exceptions';
import { ExceptionCard } from './ExceptionCard';
import { ExceptionHistory } from './ExceptionHistory';

/** Breaches of a session's sets for one athlete, worked out the way the server does. */
export type BreachSource = (
  athleteId: string,
  session: ProgramSessionDto | undefined,
) => { bySet: Map<string, Breach[]>; isPending: boolean };

/**
 * The clinician's queue: each pending request with its session, the sets concerned and how each
 * goes past its cap, the coach's reason, and the decision. Decided requests are listed below.
 */
export function ExceptionRequests({ orgId, unit, useBreaches }: { orgId: string; unit: Unit; useBreaches: BreachSource }) {
  const requests = useExceptionRequests(orgId);
  if (requests.isPending) return <Loading what="exception requests" />;
  if (requests.isError) return <ErrorNotice error={requests.error} />;
  const pending = requests.data.filter((x: ExceptionDto) => x.status === 'pending');
  const decided = requests.data.filter((x: ExceptionDto) => x.status !== 'pending');
  return (
    <div className="space-y-6">
      <section aria-labelledby="pending-heading" className="space-y-3">
        <h2 id="pending-heading" className="text-lg font-bold">
          Waiting for you <span className="font-normal text-ink-2 tabular-nums">({pending.length})</span>
        </h2>
        {pending.length === 0 ? (
          <p className="text-sm text-ink-2">No request is waiting. Coaches ask here when a planned set would go past a cap.</p>
        ) : (
          <ul className="space-y-4">
            {pending.map((x) => (
              <li key={x.id}>
                <ExceptionCard orgId={orgId} unit={unit} request={x} useBreaches={useBreaches} />
              </li>
            ))}
          </ul>
        )}
      </section>
      <section aria-labelledby="history-heading" className="space-y-3">
        <h2 id="history-heading" className="text-lg font-bold">
          Decided
        </h2>
        <ExceptionHistory requests={decided} />
      </section>
    </div>
  );
}
