import { useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { useQueryClient } from '@tanstack/react-query';
import type { ExerciseDto } from '../../../../../policies/dto';
import type { TeamVersionDto } from '../../../../../policies/dto/teams';
import { blockingBreaches } from '../../../../../policies/load/compliance';
import { formatSetScheme } from '../../../../../policies/load/set-scheme';
import type { Unit } from '../../../../../policies/schemas';
import { Button } from '../../../components/ui/Button';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Loading, PageHeader } from '../../../components/ui/Panel';
import { isApiError } from '../../../lib/api-client';
import { formatDate } from '../../../lib/format';
import { useDocumentTitle } from '../../../lib/use-document-title';
import { useExceptions } from '../../programs/api/exceptions';
import { useEngineInputs } from '../../programs/api/get-engine-inputs';
import { useLibrary } from '../../programs/api/get-library';
import { ExceptionRequestForm } from '../../programs/components/ExceptionRequestForm';
import { SessionEditor } from '../../programs/components/SessionEditor';
import { getTeamVersionQueryOptions, useTeamVersion, useVersionAction, type VersionAction } from '../api/team-programs';
import { cellWords, MARKER_GLYPHS, MARKER_WORDS, reviewedLine, stateGlyph } from './grid-words';
import { teamProgramHref } from './TeamProgramScreen';
import { versionLines } from './version-lines';

/** One athlete's version of a team session beside the session as written, with the coach's decisions on it. */
export function TeamVersionScreen({
  orgId,
  programId,
  teamSessionId,
  athleteId,
  unit,
}: {
  orgId: string;
  programId: string;
  teamSessionId: string;
  athleteId: string;
  unit: Unit;
}) {
  const version = useTeamVersion(orgId, teamSessionId, athleteId);
  const library = useLibrary(orgId);
  useDocumentTitle(version.data ? `${version.data.athleteName} · ${version.data.teamSession.title}` : 'Athlete version');
  return (
    <div className="space-y-4">
      <p className="text-sm">
        <Link to={`${teamProgramHref(programId)}?session=${teamSessionId}`}>← The team program</Link>
      </p>
      {version.isPending || library.isPending ? (
        <Loading what="the athlete’s version" />
      ) : version.isError ? (
        <ErrorNotice error={version.error} wording={{ notFound: 'This athlete’s version was not found, or you do not coach the group.' }} />
      ) : library.isError ? (
        <ErrorNotice error={library.error} />
      ) : (
        <Version orgId={orgId} programId={programId} dto={version.data} library={library.data} unit={unit} />
      )}
    </div>
  );
}

function Version({
  orgId,
  programId,
  dto,
  library,
  unit,
}: {
  orgId: string;
  programId: string;
  dto: TeamVersionDto;
  library: ExerciseDto[];
  unit: Unit;
}) {
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  const action = useVersionAction(orgId, dto.teamSession.id, dto.athleteId);
  const [editing, setEditing] = useState(false);
  const [asking, setAsking] = useState(false);
  const [sent, setSent] = useState(false);
  const athletes = [{ id: dto.athleteId, name: dto.athleteName }];
  const inputs = useEngineInputs(orgId, editing ? athletes : []);
  const exceptions = useExceptions(orgId, editing);
  const byId = new Map(library.map((e) => [e.id, e]));
  const nameOf = (exerciseId: string) => byId.get(exerciseId)?.name ?? 'Unknown exercise';
  const held = dto.version.holds.some((h) => h.breaches.length > 0);
  const published = dto.version.status === 'published';
  const { state, markers } = cellWords({
    state: dto.state,
    changes: dto.changes.length,
    needsReview: dto.needsReview,
    reviewed: dto.reviewed,
    overridden: dto.overridden,
    held,
    published,
  });
  const reviewed = reviewedLine(dto);
  const blocking = blockingBreaches(dto.breaches);
  const lines = versionLines(dto.teamSession.content, dto.version.content, dto.changes, dto.overridden);
  const refusedBreaches = isApiError(action.error)
    ? ((action.error.details as { breaches?: { breaches: { message: string }[] }[] } | undefined)?.breaches ?? []).flatMap(
        (b) => b.breaches,
      )
    : [];

  const run = (a: VersionAction, after?: () => void) => {
    action.mutate({ action: a, version: dto.version.version }, { onSuccess: () => after?.() });
  };
  const accept = () => run('accept');

  const setLabel = (setId: string) => {
    for (const e of dto.version.content.exercises) {
      const j = e.sets.findIndex((s) => s.id === setId);
      if (j >= 0) return `Set ${j + 1} of ${nameOf(e.exerciseId)}`;
    }
    return 'A set';
  };

  return (
    <>
      <PageHeader title={`${dto.athleteName} — ${dto.teamSession.title}`}>
        <span className="tabular-nums">{formatDate(dto.teamSession.date)}</span>. The team session as written, and {dto.athleteName}’s
        version of it fitted to their limits.
      </PageHeader>
      <div role="group" className="flex flex-wrap items-center gap-3 text-sm" aria-label="State of this version">
        <span className="font-semibold">
          <span aria-hidden="true">{stateGlyph(dto)}</span> {state}
        </span>
        {markers.map((m) => (
          <span key={m} className="rounded border border-rule-strong px-1.5 py-0.5 text-xs font-semibold">
            <span aria-hidden="true">{MARKER_GLYPHS[m]}</span> {MARKER_WORDS[m]}
          </span>
        ))}
      </div>

      {dto.proposal && (
        <Notice tone="caution" title="A new fit after a limit change">
          <p>
            The clinician changed {dto.athleteName}’s limits. The fitting proposes this version instead
            {dto.proposal.changes.length ? ':' : ' (the team session as written).'}
          </p>
          {dto.proposal.changes.length > 0 && (
            <ul aria-label="Proposed changes" className="list-disc pl-5">
              {dto.proposal.changes.map((c, i) => (
                <li key={i}>
                  {nameOf(c.exerciseId)}: {c.before} → {c.after ?? 'dropped'} ({c.note})
                </li>
              ))}
            </ul>
          )}
        </Notice>
      )}

      <div className="flex flex-wrap gap-2" role="group" aria-label="Decisions on this version">
        {(dto.proposal || dto.needsReview || (dto.state === 'needs_decision' && !dto.reviewed)) && (
          <Button busy={action.isPending && action.variables?.action === 'accept'} onClick={accept}>
            {dto.proposal ? 'Accept the new fit' : dto.state === 'needs_decision' ? 'Accept the drop' : 'Mark as reviewed'}
          </Button>
        )}
        <Button variant="secondary" onClick={() => setEditing((v) => !v)} aria-expanded={editing}>
          {editing ? 'Close the editor' : 'Edit this version'}
        </Button>
        <Button
          variant="secondary"
          busy={action.isPending && action.variables?.action === 'as-written'}
          onClick={() => run('as-written', () => setAsking(true))}
        >
          Back to as written
        </Button>
        {blocking.length > 0 && (
          <Button variant="secondary" onClick={() => setAsking(true)}>
            Ask for an exception
          </Button>
        )}
        <Button variant="secondary" busy={action.isPending && action.variables?.action === 'reset'} onClick={() => run('reset')}>
          Reset to the fitted version
        </Button>
      </div>
      {action.isError && (
        <Notice tone="problem" role="alert" title="Not done">
          <p>{isApiError(action.error) ? action.error.message : 'Something unexpected happened. Please try again.'}</p>
          {refusedBreaches.length > 0 && (
            <ul className="list-disc pl-5">
              {refusedBreaches.map((b, i) => (
                <li key={i}>{b.message}</li>
              ))}
            </ul>
          )}
        </Notice>
      )}
      {/* Lasting: read from the version itself, so it is there whenever the screen is opened again. */}
      <div role="status">
        {reviewed && (
          <Notice
            tone="done"
            title={
              <>
                <span aria-hidden="true">{MARKER_GLYPHS[reviewed.marker]}</span> {reviewed.title}
              </>
            }
          >
            <p>{reviewed.words}</p>
          </Notice>
        )}
      </div>
      {sent && (
        <Notice tone="done" role="status" title="Exception requested">
          <p>The clinician decides. Until they grant it, this version keeps the session from being published.</p>
        </Notice>
      )}
      {asking && blocking.length > 0 && (
        <ExceptionRequestForm
          orgId={orgId}
          sessionId={dto.version.id}
          athletes={athletes}
          setsFor={() =>
            blocking
              .filter((b, i) => blocking.findIndex((x) => x.setId === b.setId) === i)
              .map((b) => ({ setId: b.setId, label: setLabel(b.setId), words: b.message }))
          }
          onDone={() => {
            setAsking(false);
            setSent(true);
          }}
          onCancel={() => setAsking(false)}
        />
      )}

      {blocking.length > 0 ? (
        <Notice tone="problem" title="Past a limit">
          <ul aria-label="Limits this version goes past" className="list-disc pl-5">
            {blocking.map((b, i) => (
              <li key={i}>{b.message}</li>
            ))}
          </ul>
        </Notice>
      ) : (
        <p className="text-sm text-ink-2">The engine finds nothing in this version past {dto.athleteName}’s limits.</p>
      )}

      <section aria-labelledby="line-by-line" className="space-y-2">
        <h2 id="line-by-line" className="text-lg font-bold">
          Line by line
        </h2>
        <div className="overflow-x-auto">
          <table className="min-w-full border-collapse text-sm">
            <thead>
              <tr>
                <th scope="col" className="border-b border-rule px-2 py-1 text-left">
                  As written
                </th>
                <th scope="col" className="border-b border-rule px-2 py-1 text-left">
                  {dto.athleteName}’s version
                </th>
                <th scope="col" className="border-b border-rule px-2 py-1 text-left">
                  What changed, and why
                </th>
              </tr>
            </thead>
            <tbody>
              {lines.map((l, i) => (
                <tr key={i} className="align-top">
                  <td className="border-b border-rule px-2 py-1">
                    {l.team ? (
                      <>
                        <span className="font-semibold">{nameOf(l.team.exerciseId)}</span>
                        <span className="block tabular-nums">{formatSetScheme(l.team.sets)}</span>
                      </>
                    ) : (
                      '—'
                    )}
                  </td>
                  <td className="border-b border-rule px-2 py-1">
                    {l.mine ? (
                      <>
                        <span className="font-semibold">{nameOf(l.mine.exerciseId)}</span>
                        <span className="block tabular-nums">{formatSetScheme(l.mine.sets)}</span>
                      </>
                    ) : l.team && !dto.overridden ? (
                      <span className="font-semibold">Left out</span>
                    ) : (
                      '—'
                    )}
                  </td>
                  <td className="border-b border-rule px-2 py-1">
                    {l.changes.length === 0 ? (
                      <span className="text-ink-2">{l.team && l.mine ? 'No change' : ''}</span>
                    ) : (
                      <ul className="space-y-0.5">
                        {l.changes.map((c, k) => (
                          <li key={k}>
                            <span className="tabular-nums">
                              {c.before} → {c.after ?? 'dropped'}
                              {c.swappedToExerciseId ? ` (${nameOf(c.swappedToExerciseId)} instead)` : ''}
                            </span>
                            <span className="block text-ink-2">{c.note}</span>
                          </li>
                        ))}
                      </ul>
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        {dto.overridden && (
          <p className="text-sm text-ink-2">
            Edited by hand: a change to the team session is no longer fitted into this version until you reset it.
          </p>
        )}
      </section>

      {editing && (
        <SessionEditor
          key={`${dto.version.id}:${dto.version.version}`}
          orgId={orgId}
          unit={unit}
          athletes={athletes}
          session={dto.version}
          library={library}
          engines={inputs.engines}
          enginesPending={inputs.isPending}
          exceptions={exceptions.data ?? []}
          onReload={async () => {
            const fresh = await queryClient
              .fetchQuery({ ...getTeamVersionQueryOptions(orgId, dto.teamSession.id, dto.athleteId), staleTime: 0 })
              .catch(() => null);
            return fresh?.version ?? null;
          }}
          onDeleted={() => void navigate(teamProgramHref(programId))}
        />
      )}
    </>
  );
}
