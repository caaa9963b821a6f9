import { Link } from 'react-router-dom';
import type { TeamPublishProblemDto } from '../../../../../policies/dto/teams';
import { Notice } from '../../../components/ui/Notice';
import { formatDate } from '../../../lib/format';

/** A refused group publish: nothing went out, and every athlete, session and problem is listed. */
export function PublishProblems({
  message,
  problems,
  hrefFor,
}: {
  message: string;
  problems: TeamPublishProblemDto[];
  hrefFor?: (teamSessionId: string, athleteId: string) => string;
}) {
  return (
    <Notice tone="problem" role="alert" title="Nothing was published">
      <p>{message}</p>
      <ul aria-label="Problems to resolve before publishing" className="mt-2 space-y-2">
        {problems.map((p) => (
          <li key={`${p.teamSessionId}:${p.athleteId}`} className="border-l-2 border-line-deep pl-2">
            <p className="font-semibold text-ink">
              {hrefFor ? <Link to={hrefFor(p.teamSessionId, p.athleteId)}>{p.athleteName}</Link> : p.athleteName} — {p.title},{' '}
              <span className="tabular-nums">{formatDate(p.date)}</span>
            </p>
            <ul className="list-disc pl-5">
              {p.problems.map((words, i) => (
                <li key={i}>{words}</li>
              ))}
            </ul>
          </li>
        ))}
      </ul>
    </Notice>
  );
}
