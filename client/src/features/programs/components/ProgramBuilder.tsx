import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import { useQueryClient } from '@tanstack/react-query';
import type { ProgramDto, ProgramSessionDto } from '../../../../../policies/dto';
import { blockingBreaches } from '../../../../../policies/load/compliance';
import type { Unit } from '../../../../../policies/schemas';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Loading, PageHeader } from '../../../components/ui/Panel';
import { joinNames } from '../../../lib/format';
import { useDocumentTitle } from '../../../lib/use-document-title';
import { useExceptions } from '../api/exceptions';
import { useEngineInputs } from '../api/get-engine-inputs';
import { useLibrary } from '../api/get-library';
import { getProgramQueryOptions, useProgram } from '../api/get-programs';
import { AddSessionForm } from './AddSessionForm';
import { engineLibrary, liveBreaches } from './live-check';
import { ExerciseLibraryLink, SessionPane, useChosenSession } from './program-screen-parts';
import { ProgramTools } from './ProgramTools';
import { groupByWeek } from './program-words';
import { SessionEditor } from './SessionEditor';
import { WeeksView } from './WeeksView';

/** The program page: weeks on the left, the chosen session's editor on the right (stacked on a phone). */
export function ProgramBuilder({
  orgId,
  programId,
  unit,
  backTo,
}: {
  orgId: string;
  programId: string;
  unit: Unit;
  backTo: { href: string; label: string };
}) {
  const program = useProgram(orgId, programId);
  useDocumentTitle(program.data?.name ?? 'Program');
  return (
    <div className="space-y-4">
      <p className="text-sm">
        <Link to={backTo.href}>← {backTo.label}</Link>
      </p>
      {program.isPending ? (
        <Loading what="the program" />
      ) : program.isError ? (
        <ErrorNotice
          error={program.error}
          wording={{ notFound: 'This program was not found, or it includes an athlete you do not coach.' }}
        />
      ) : (
        <Builder orgId={orgId} program={program.data} unit={unit} />
      )}
    </div>
  );
}

function Builder({ orgId, program, unit }: { orgId: string; program: ProgramDto; unit: Unit }) {
  const queryClient = useQueryClient();
  const [epoch, setEpoch] = useState(0);
  const library = useLibrary(orgId);
  const exceptions = useExceptions(orgId);
  const athletes = useMemo(() => program.athleteIds.map((id, i) => ({ id, name: program.athleteNames[i] ?? 'Athlete' })), [program]);
  const inputs = useEngineInputs(orgId, athletes);
  const exercises = useMemo(() => engineLibrary(library.data ?? []), [library.data]);

  const sessions = program.sessions;
  const { selectedId, selected, select, lastDate } = useChosenSession(sessions);
  const weeks = groupByWeek(sessions).map((w) => w.monday);
  const hrefFor = (id: string) => `?session=${id}`;

  const granted = new Set((exceptions.data ?? []).filter((x) => x.status === 'granted').flatMap((x) => x.grantedSetIds));
  const overCap = (s: ProgramSessionDto) => {
    const sets = new Set<string>();
    for (const engine of inputs.engines) {
      for (const b of blockingBreaches(liveBreaches({ session: s, engine, exercises, unit, waived: granted }))) sets.add(b.setId);
    }
    return sets.size;
  };

  async function reload(): Promise<ProgramSessionDto | null> {
    const fresh = await queryClient.fetchQuery({ ...getProgramQueryOptions(orgId, program.id), staleTime: 0 }).catch(() => null);
    return fresh?.sessions.find((s) => s.id === selectedId) ?? null;
  }

  return (
    <>
      <PageHeader title={program.name} actions={<ExerciseLibraryLink />}>
        {athletes.length === 1
          ? `For ${athletes[0].name}.`
          : `For a group: ${joinNames(athletes.map((a) => a.name))}. Every set is checked for each of them.`}
      </PageHeader>
      {inputs.error ? (
        <Notice tone="caution" title="Some limits could not be loaded">
          <p>The live check may miss a breach. The server still checks every set when you publish.</p>
        </Notice>
      ) : null}
      {library.isError && <ErrorNotice error={library.error} />}
      <div className="grid gap-5 lg:grid-cols-[17rem_minmax(0,1fr)]">
        <div className="space-y-4">
          <section aria-label="Add a session" className="rounded-lg border border-rule bg-sheet p-3">
            <AddSessionForm orgId={orgId} programId={program.id} lastDate={lastDate} onAdded={(s) => select(s.id)} />
          </section>
          <WeeksView sessions={sessions} selectedId={selectedId} hrefFor={hrefFor} overCap={overCap} />
          <ProgramTools orgId={orgId} programId={program.id} weeks={weeks} onChanged={() => setEpoch((n) => n + 1)} />
        </div>
        <SessionPane
          selected={selected}
          library={library.data}
          prompt={sessions.length ? 'Choose a session from the weeks to edit it.' : 'Add a session to start writing this program.'}
        >
          {(chosen, lib) => (
            <SessionEditor
              key={`${chosen.id}:${epoch}`}
              orgId={orgId}
              unit={unit}
              athletes={athletes}
              session={chosen}
              library={lib}
              engines={inputs.engines}
              enginesPending={inputs.isPending}
              exceptions={exceptions.data ?? []}
              onReload={reload}
              onDeleted={() => select(null)}
            />
          )}
        </SessionPane>
      </div>
    </>
  );
}
