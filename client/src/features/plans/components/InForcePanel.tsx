import { useId, useState } from 'react';
import type { Unit } from '../../../../../policies/schemas';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Loading } from '../../../components/ui/Panel';
import { todayLocal } from '../../../lib/dates';
import { useInForce } from '../api/get-in-force';
import { InForceSummary } from './InForceSummary';

/** "What is allowed on <date>" for the care team: pick any day, past or coming. */
export function InForcePanel({ orgId, athleteId, unit }: { orgId: string; athleteId: string; unit: Unit }) {
  const headingId = useId();
  const dateId = useId();
  const [date, setDate] = useState(todayLocal());
  const valid = /^\d{4}-\d{2}-\d{2}$/.test(date);
  const inForce = useInForce(orgId, athleteId, date, valid);

  return (
    <section aria-labelledby={headingId} className="rounded-lg border border-rule bg-sheet p-4 sm:p-5">
      <div className="mb-3 flex flex-wrap items-center gap-x-3 gap-y-2">
        <h2 id={headingId} className="text-lg font-bold">
          What is allowed on
        </h2>
        <label htmlFor={dateId} className="sr-only">
          Date to check
        </label>
        <input
          id={dateId}
          type="date"
          value={date}
          onChange={(e) => setDate(e.target.value)}
          className="min-h-10 rounded-md border border-rule-strong bg-sheet px-2 text-sm tabular-nums"
        />
        {date !== todayLocal() && (
          <button type="button" className="text-sm underline underline-offset-4" onClick={() => setDate(todayLocal())}>
            Back to today
          </button>
        )}
      </div>
      {!valid ? (
        <p className="text-sm text-muted">Pick a date.</p>
      ) : inForce.isPending ? (
        <Loading what="what is allowed" />
      ) : inForce.isError ? (
        <ErrorNotice error={inForce.error} />
      ) : (
        <InForceSummary inForce={inForce.data} unit={unit} />
      )}
    </section>
  );
}
