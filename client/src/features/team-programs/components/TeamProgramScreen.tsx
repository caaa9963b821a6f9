import { useState } from 'react';
import { Link } from 'react-router-dom';
import { useQueryClient } from '@tanstack/react-query';
import type { TeamProgramDto } from '../../../../../policies/dto/teams';
import type { Unit } from '../../../../../policies/schemas';
import { Button } from '../../../components/ui/Button';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Loading, PageHeader } from '../../../components/ui/Panel';
import { formatDate, joinNames } from '../../../lib/format';
import { useDocumentTitle } from '../../../lib/use-document-title';
import { useLibrary } from '../../programs/api/get-library';
import { ExerciseLibraryLink, SessionPane, useChosenSession } from '../../programs/components/program-screen-parts';
import { plural } from '../../programs/components/program-words';
import {
  getTeamProgramQueryOptions,
  publishProblems,
  usePublishTeamSessions,
  useTeamGrid,
  useTeamProgram,
  type PublishResult,
} from '../api/team-programs';
import { AddTeamSessionForm } from './AddTeamSessionForm';
import { FloorSheetLinks } from './FloorSheetLinks';
import { PublishProblems } from './PublishProblems';
import { RenameTeamProgram } from './RenameTeamProgram';
import { ReviewGrid } from './ReviewGrid';
import { TeamSessionEditor } from './TeamSessionEditor';

export const teamProgramHref = (programId: string) => `/coach/team-programs/${programId}`;
export const teamVersionHref = (programId: string, teamSessionId: string, athleteId: string) =>
  `/coach/team-programs/${programId}/sessions/${teamSessionId}/athletes/${athleteId}`;

/** The coach's team program: write a team session once, review each athlete's version, publish to the group. */
export function TeamProgramScreen({ orgId, programId, unit }: { orgId: string; programId: string; unit: Unit }) {
  const program = useTeamProgram(orgId, programId);
  useDocumentTitle(program.data?.name ?? 'Team program');
  return (
    <div className="space-y-4">
      <p className="text-sm">
        <Link to="/coach">← My athletes</Link>
      </p>
      {program.isPending ? (
        <Loading what="the team program" />
      ) : program.isError ? (
        <ErrorNotice error={program.error} wording={{ notFound: 'This team program was not found, or you do not coach its group.' }} />
      ) : (
        <TeamProgram orgId={orgId} program={program.data} unit={unit} />
      )}
    </div>
  );
}

function TeamProgram({ orgId, program, unit }: { orgId: string; program: TeamProgramDto; unit: Unit }) {
  const queryClient = useQueryClient();
  const [epoch, setEpoch] = useState(0);
  const library = useLibrary(orgId);
  const grid = useTeamGrid(orgId, program.id);
  const publish = usePublishTeamSessions(orgId, program.id);
  const [chosen, setChosen] = useState<ReadonlySet<string>>(new Set());
  const [done, setDone] = useState<PublishResult | null>(null);

  const sessions = program.teamSessions;
  const { selectedId, selected, select, lastDate } = useChosenSession(sessions);
  const nameOf = (athleteId: string) => program.athletes.find((a) => a.id === athleteId)?.name ?? 'Athlete';
  const hrefFor = (teamSessionId: string, athleteId: string) => teamVersionHref(program.id, teamSessionId, athleteId);
  const problems = publishProblems(publish.error);

  function runPublish(ids: string[]) {
    setDone(null);
    publish.mutate(ids, {
      onSuccess: (result) => {
        setDone(result);
        setChosen(new Set());
      },
    });
  }

  async function reload() {
    await queryClient.fetchQuery({ ...getTeamProgramQueryOptions(orgId, program.id), staleTime: 0 }).catch(() => null);
    setEpoch((n) => n + 1);
  }

  return (
    <>
      <PageHeader title={program.name} actions={<ExerciseLibraryLink />}>
        Team program of <span className="font-semibold">{program.groupName}</span>
        {program.athletes.length ? `: ${joinNames(program.athletes.map((a) => a.name))}.` : ' (no athletes yet).'} Write each session once;
        it is fitted to each athlete’s limits, and nothing reaches an athlete until you publish.
      </PageHeader>
      {program.archived ? (
        <Notice tone="info" title="Kept for the record">
          <p>{program.groupName} is archived: this program can be read but no longer changed or published.</p>
        </Notice>
      ) : (
        <RenameTeamProgram orgId={orgId} program={program} onReload={reload} />
      )}
      {library.isError && <ErrorNotice error={library.error} />}
      <div className="grid gap-5 lg:grid-cols-[17rem_minmax(0,1fr)]">
        <div className="space-y-4">
          {!program.archived && (
            <section aria-label="Add a team session" className="rounded-lg border border-rule bg-sheet p-3">
              <AddTeamSessionForm orgId={orgId} programId={program.id} lastDate={lastDate} onAdded={(s) => select(s.id)} />
            </section>
          )}
          <nav aria-label="Team sessions" className="rounded-lg border border-rule bg-sheet p-3">
            <h2 className="mb-2 font-bold">Team sessions</h2>
            {sessions.length === 0 ? (
              <p className="text-sm text-ink-2">None yet.</p>
            ) : (
              <ul className="space-y-1 text-sm">
                {sessions.map((s) => (
                  <li key={s.id}>
                    <Link
                      to={`?session=${s.id}`}
                      aria-current={s.id === selectedId ? 'page' : undefined}
                      className="aria-[current=page]:font-bold"
                    >
                      <span className="tabular-nums">{formatDate(s.date)}</span> · {s.title}
                    </Link>{' '}
                    <span className="text-xs text-ink-2">
                      ({s.status === 'published' ? 'published' : 'draft'}, {plural(s.content.exercises.length, 'exercise')})
                    </span>
                  </li>
                ))}
              </ul>
            )}
          </nav>
        </div>
        <SessionPane
          selected={selected}
          library={library.data}
          prompt={sessions.length ? 'Choose a team session to edit it.' : 'Add a team session to start writing this program.'}
        >
          {(chosen, lib) => (
            <TeamSessionEditor
              key={`${chosen.id}:${chosen.version}:${epoch}`}
              orgId={orgId}
              unit={unit}
              session={chosen}
              library={lib}
              athleteName={nameOf}
              headerLinks={<FloorSheetLinks orgId={orgId} teamSessionId={chosen.id} />}
              onSaved={() => undefined}
              onDeleted={() => select(null)}
              onReload={() => void reload()}
            />
          )}
        </SessionPane>
      </div>
      <section aria-labelledby="review-grid" className="space-y-3">
        <div className="flex flex-wrap items-end justify-between gap-2">
          <div>
            <h2 id="review-grid" className="text-lg font-bold">
              Review
            </h2>
            <p className="max-w-prose text-sm text-ink-2">
              Each athlete’s version of each team session. Open a cell to see it line by line. Publishing sends the chosen sessions to the
              whole group at once, or nothing if any version needs attention.
            </p>
          </div>
          {!program.archived && (
            <Button disabled={chosen.size === 0} busy={publish.isPending} onClick={() => runPublish([...chosen])}>
              Publish the chosen sessions ({chosen.size})
            </Button>
          )}
        </div>
        {problems ? (
          <PublishProblems message={(publish.error as Error).message} problems={problems} hrefFor={hrefFor} />
        ) : (
          publish.isError && <ErrorNotice error={publish.error} title="Nothing was published" />
        )}
        {done && (
          <Notice tone="done" role="status" title="Published to the group">
            <p>
              {plural(done.published, 'athlete version')} published.
              {done.outSkipped.length > 0 &&
                ` Skipped for athletes who are Out on the day: ${joinNames([...new Set(done.outSkipped.map((o) => nameOf(o.athleteId)))])}.`}
            </p>
          </Notice>
        )}
        {grid.isPending ? (
          <Loading what="the review grid" />
        ) : grid.isError ? (
          <ErrorNotice error={grid.error} />
        ) : (
          <ReviewGrid
            grid={grid.data}
            hrefFor={hrefFor}
            chosen={chosen}
            onChoose={(id, on) =>
              setChosen((old) => {
                const next = new Set(old);
                if (on) next.add(id);
                else next.delete(id);
                return next;
              })
            }
            onPublish={runPublish}
            publishing={publish.isPending}
            canPublish={!program.archived}
          />
        )}
      </section>
    </>
  );
}
