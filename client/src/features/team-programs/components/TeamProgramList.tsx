import { Link } from 'react-router-dom';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Loading } from '../../../components/ui/Panel';
import { plural } from '../../programs/components/program-words';
import { useTeamPrograms } from '../api/team-programs';
import { teamProgramHref } from './TeamProgramScreen';

/** The coach home's "Team programs": the programs of the groups the reader coaches. */
export function TeamProgramList({ orgId }: { orgId: string }) {
  const programs = useTeamPrograms(orgId);
  return (
    <section aria-labelledby="team-programs" className="space-y-2">
      <h2 id="team-programs" className="text-lg font-bold">
        Team programs
      </h2>
      {programs.isPending ? (
        <Loading what="team programs" />
      ) : programs.isError ? (
        <ErrorNotice error={programs.error} />
      ) : programs.data.length === 0 ? (
        <p className="text-sm text-ink-2">No team program yet. A team program is written once for a group and fitted to each athlete.</p>
      ) : (
        <ul className="divide-y divide-rule rounded-lg border border-rule bg-sheet">
          {programs.data.map((p) => (
            <li key={p.id} className="flex flex-wrap items-baseline justify-between gap-2 px-3 py-2">
              <Link to={teamProgramHref(p.id)} className="font-semibold">
                {p.name}
              </Link>
              <span className="text-sm text-ink-2">
                {p.groupName} · {plural(p.sessions, 'team session')}
              </span>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
