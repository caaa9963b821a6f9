import { Link } from 'react-router-dom';
import type { ClipDto } from '../../../../../policies/dto';
import { formatDate, formatDateTime } from '../../../lib/format';

export const clipHref = (clipId: string) => `/clips/${clipId}`;

const notesWords = (n: number) => (n === 0 ? 'no notes yet' : n === 1 ? '1 note' : `${n} notes`);

/** Clips newest first: the session's date, the exercise, how many notes, each opening the player. */
export function ClipList({ clips, empty, showAthlete = false }: { clips: readonly ClipDto[]; empty: string; showAthlete?: boolean }) {
  if (clips.length === 0) return <p className="text-sm text-ink-2">{empty}</p>;
  return (
    <ul className="divide-y divide-rule rounded-md border border-rule">
      {clips.map((clip) => (
        <li key={clip.id} className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-0.5 px-3 py-2 text-sm">
          <span className="min-w-0">
            <Link to={clipHref(clip.id)} className="font-semibold">
              {clip.exercise}, {formatDate(clip.sessionDate)}
            </Link>
            {showAthlete && <span className="text-ink-2"> · {clip.athleteName}</span>}
            {clip.caption && <span className="block break-words text-ink-2">“{clip.caption}”</span>}
          </span>
          <span className="text-muted tabular-nums">
            <span className={clip.noteCount > 0 ? 'font-semibold text-ink' : undefined}>{notesWords(clip.noteCount)}</span> · added by{' '}
            {clip.uploadedByName}, {formatDateTime(clip.uploadedAt)}
          </span>
        </li>
      ))}
    </ul>
  );
}
