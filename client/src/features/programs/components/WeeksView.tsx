import { Link } from 'react-router-dom';
import type { ProgramSessionDto } from '../../../../../policies/dto';
import { cx } from '../../../components/ui/cx';
import { dayLabel, groupByWeek, plural, weekLabel } from './program-words';

/**
 * The program's sessions by ISO week (Monday start). Each row says what needs attention: on hold
 * for someone, or sets over a cap.
 */
export function WeeksView({
  sessions,
  selectedId,
  hrefFor,
  overCap,
}: {
  sessions: ProgramSessionDto[];
  selectedId: string | null;
  hrefFor: (sessionId: string) => string;
  /** Sets of the saved session that go past a cap for any athlete (exceptions granted left out). */
  overCap: (session: ProgramSessionDto) => number;
}) {
  const weeks = groupByWeek(sessions);
  if (weeks.length === 0) return <p className="text-sm text-ink-2">No session yet. Add the first one above.</p>;
  return (
    <ol aria-label="Weeks" className="space-y-3">
      {weeks.map((week) => (
        <li key={week.monday}>
          <h2 className="text-sm font-bold tabular-nums">{weekLabel(week.monday)}</h2>
          <ul className="mt-1 divide-y divide-rule rounded-md border border-rule bg-sheet">
            {week.items.map((s) => {
              const over = s.status === 'draft' ? overCap(s) : 0;
              const held = s.holds.filter((h) => h.breaches.length > 0).length;
              const current = s.id === selectedId;
              return (
                <li key={s.id}>
                  <Link
                    to={hrefFor(s.id)}
                    aria-current={current ? 'true' : undefined}
                    className={cx(
                      'block px-2.5 py-1.5 text-sm no-underline hover:bg-shade',
                      current && 'bg-shade shadow-[inset_4px_0_0_var(--color-ink)]',
                    )}
                  >
                    <span className="flex items-baseline justify-between gap-2">
                      <span className="font-semibold">{s.title}</span>
                      <span className="shrink-0 text-xs text-muted tabular-nums">{dayLabel(s.date)}</span>
                    </span>
                    <span className="flex flex-wrap gap-x-2 text-xs">
                      <span className="text-ink-2">{s.status === 'published' ? '■ Published' : '□ Draft'}</span>
                      {held > 0 && <span className="font-semibold text-line-deep">▲ On hold{held > 1 ? ` for ${held}` : ''}</span>}
                      {over > 0 && <span className="font-semibold text-line-deep">▲ {plural(over, 'set')} over a cap</span>}
                    </span>
                  </Link>
                </li>
              );
            })}
          </ul>
        </li>
      ))}
    </ol>
  );
}
