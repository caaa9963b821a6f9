import { Link } from 'react-router-dom';
import type { GridCellDto, TeamGridDto } from '../../../../../policies/dto/teams';
import { Button } from '../../../components/ui/Button';
import { StatusMark } from '../../../components/ui/StatusMark';
import { cx } from '../../../components/ui/cx';
import { formatDate } from '../../../lib/format';
import { cellNeedsAttention, cellSentence, cellWords, MARKER_GLYPHS, MARKER_WORDS, stateGlyph } from './grid-words';

/**
 * Athletes × team sessions. Each cell is a link to that athlete's version, saying its state in words
 * with a glyph and its markers the same way. On a narrow screen the table scrolls sideways and the
 * athlete column stays put.
 */
export function ReviewGrid({
  grid,
  hrefFor,
  chosen,
  onChoose,
  onPublish,
  publishing,
  canPublish,
}: {
  grid: TeamGridDto;
  hrefFor: (teamSessionId: string, athleteId: string) => string;
  chosen: ReadonlySet<string>;
  onChoose: (teamSessionId: string, on: boolean) => void;
  onPublish: (teamSessionIds: string[]) => void;
  publishing: boolean;
  canPublish: boolean;
}) {
  const cellOf = new Map(grid.cells.map((c) => [`${c.teamSessionId}:${c.athleteId}`, c]));
  if (grid.sessions.length === 0)
    return <p className="text-sm text-ink-2">No team session yet. Add one above; every athlete’s version appears here.</p>;
  if (grid.athletes.length === 0) return <p className="text-sm text-ink-2">The group has no athletes yet.</p>;
  return (
    <div className="overflow-x-auto rounded-lg border border-rule" role="region" aria-label="Review grid, scrolls sideways" tabIndex={0}>
      <table className="min-w-full border-collapse text-sm">
        <caption className="sr-only">Each athlete’s version of each team session</caption>
        <thead>
          <tr>
            <th scope="col" className="sticky left-0 z-10 min-w-[8rem] border-b border-rule bg-sheet px-2 py-2 text-left align-bottom">
              Athlete
            </th>
            {grid.sessions.map((s) => (
              <th key={s.id} scope="col" className="min-w-[10rem] border-b border-l border-rule bg-shade px-2 py-2 text-left align-bottom">
                <span className="block font-bold">{s.title}</span>
                <span className="block font-normal text-ink-2 tabular-nums">{formatDate(s.date)}</span>
                <span className="block text-xs font-semibold">
                  {s.status === 'published' ? `${MARKER_GLYPHS.published} Published` : 'Draft'}
                </span>
                {s.setCount === 0 && (
                  <span className="block text-xs font-normal text-ink-2">No sets yet: open the session to write them</span>
                )}
                {canPublish && (
                  <span className="mt-1 flex flex-col items-start gap-1 font-normal">
                    <label className="inline-flex items-center gap-1 text-xs">
                      <input type="checkbox" checked={chosen.has(s.id)} onChange={(e) => onChoose(s.id, e.target.checked)} />
                      Choose {s.title}
                    </label>
                    <Button
                      size="sm"
                      variant="secondary"
                      disabled={publishing}
                      onClick={() => onPublish([s.id])}
                      aria-label={`Publish ${s.title} to the group`}
                    >
                      Publish to the group
                    </Button>
                  </span>
                )}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {grid.athletes.map((a) => (
            <tr key={a.id}>
              <th scope="row" className="sticky left-0 z-10 border-b border-rule bg-sheet px-2 py-2 text-left align-top font-semibold">
                <span className="block">{a.name}</span>
                <StatusMark status={a.statusToday} className="text-xs font-normal" />
              </th>
              {grid.sessions.map((s) => {
                const cell = cellOf.get(`${s.id}:${a.id}`);
                return (
                  <td key={s.id} className="border-b border-l border-rule px-2 py-2 align-top">
                    {s.setCount === 0 ? (
                      <span className="text-ink-2">Nothing written yet</span>
                    ) : cell && cell.versionId ? (
                      <GridCell cell={cell} href={hrefFor(s.id, a.id)} label={cellSentence(a.name, s.title, cell)} />
                    ) : (
                      <span className="text-ink-2">Not fitted yet</span>
                    )}
                  </td>
                );
              })}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

export function GridCell({ cell, href, label }: { cell: GridCellDto; href: string; label: string }) {
  const { state, markers } = cellWords(cell);
  const attention = cellNeedsAttention(cell);
  return (
    <Link
      to={href}
      aria-label={label}
      data-state={cell.state}
      className={cx(
        'block rounded border px-1.5 py-1 no-underline hover:underline',
        attention ? 'border-2 border-line-deep' : 'border-rule',
      )}
    >
      <span className="flex items-center gap-1 font-semibold text-ink">
        <span aria-hidden="true">{stateGlyph(cell)}</span>
        {state}
      </span>
      {markers.map((m) => (
        <span key={m} className="flex items-center gap-1 text-xs text-ink-2">
          <span aria-hidden="true">{MARKER_GLYPHS[m]}</span>
          {MARKER_WORDS[m]}
        </span>
      ))}
    </Link>
  );
}
