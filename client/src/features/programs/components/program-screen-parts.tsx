import type { ReactNode } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import type { ExerciseDto } from '../../../../../policies/dto';
import { Loading } from '../../../components/ui/Panel';

/**
 * What the one-athlete program page and the team program page share around their session editor:
 * the session chosen in the address (`?session=`, so back and forward move between sessions), the
 * link to the exercise library, and the pane that holds the editor.
 */

/** The session named by `?session=` among the program's (date-ordered) sessions, and the last date for the next one. */
export function useChosenSession<S extends { id: string; date: string }>(sessions: readonly S[]) {
  const [params, setParams] = useSearchParams();
  const selectedId = params.get('session');
  return {
    selectedId,
    selected: sessions.find((s) => s.id === selectedId) ?? null,
    select: (id: string | null) => setParams(id ? { session: id } : {}, { replace: false }),
    lastDate: sessions.length ? sessions[sessions.length - 1].date : null,
  };
}

export function ExerciseLibraryLink() {
  return (
    <Link to="/coach/exercises" className="text-sm font-semibold">
      Exercise library
    </Link>
  );
}

/** The chosen session's editor once the library it picks from is loaded; with none chosen, `prompt` says what to do. */
export function SessionPane<S>({
  selected,
  library,
  prompt,
  children,
}: {
  selected: S | null;
  library: ExerciseDto[] | undefined;
  prompt: string;
  children: (selected: S, library: ExerciseDto[]) => ReactNode;
}) {
  return (
    <div className="min-w-0">
      {selected && library ? (
        children(selected, library)
      ) : selected ? (
        <Loading what="the exercise library" />
      ) : (
        <p className="rounded-lg border border-dashed border-rule-strong px-4 py-6 text-sm text-ink-2">{prompt}</p>
      )}
    </div>
  );
}
