import { Link } from 'react-router-dom';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Loading } from '../../../components/ui/Panel';
import { formatDate } from '../../../lib/format';
import { usePrograms } from '../api/get-programs';
import { NewProgram, programHref } from './NewProgramForm';
import { plural } from './program-words';

/** An athlete's programs for their coach, with what needs attention in each. */
export function AthletePrograms({
  orgId,
  athleteId,
  athleteName,
  today,
}: {
  orgId: string;
  athleteId: string;
  athleteName: string;
  today: string;
}) {
  const programs = usePrograms(orgId, athleteId);
  return (
    <div className="space-y-3">
      {programs.isPending ? (
        <Loading what="programs" />
      ) : programs.isError ? (
        <ErrorNotice error={programs.error} />
      ) : programs.data.length === 0 ? (
        <p className="text-sm text-ink-2">No program yet.</p>
      ) : (
        <ul className="divide-y divide-rule rounded-md border border-rule">
          {programs.data.map((p) => {
            const upcoming = p.sessions.filter((s) => s.date >= today);
            const held = p.sessions.filter((s) => s.holds.some((h) => h.athleteId === athleteId && h.breaches.length > 0)).length;
            const drafts = upcoming.filter((s) => s.status === 'draft').length;
            const next = upcoming.find((s) => s.status === 'published');
            return (
              <li key={p.id} className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1 px-3 py-2 text-sm">
                <span>
                  <Link to={programHref(p.id)} className="font-semibold">
                    {p.name}
                  </Link>
                  {p.athleteIds.length > 1 && <span className="text-muted"> · group of {p.athleteIds.length}</span>}
                </span>
                <span className="flex flex-wrap gap-x-3 text-ink-2 tabular-nums">
                  {held > 0 && <span className="font-semibold text-line-deep">▲ {plural(held, 'session')} on hold</span>}
                  {drafts > 0 && <span>{plural(drafts, 'draft session')} still to publish</span>}
                  <span>{next ? `next ${formatDate(next.date)}` : 'nothing published yet'}</span>
                </span>
              </li>
            );
          })}
        </ul>
      )}
      <NewProgram orgId={orgId} athletes={[{ id: athleteId, name: athleteName }]} preset={[athleteId]} />
    </div>
  );
}
