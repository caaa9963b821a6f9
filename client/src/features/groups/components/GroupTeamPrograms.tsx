import { useState, type FormEvent } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { isApiError } from '../../../lib/api-client';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Loading } from '../../../components/ui/Panel';
import { useCreateTeamProgram, useGroupTeamPrograms } from '../api/groups';

export const teamProgramHref = (programId: string) => `/coach/team-programs/${programId}`;

/** The group's team programs, and a form to start one (then opens it). */
export function GroupTeamPrograms({ orgId, groupId, canStart }: { orgId: string; groupId: string; canStart: boolean }) {
  const programs = useGroupTeamPrograms(orgId, groupId);
  const create = useCreateTeamProgram(orgId, groupId);
  const navigate = useNavigate();
  const [name, setName] = useState('');
  const nameError = isApiError(create.error) ? create.error.fields.name?.[0] : undefined;

  function submit(e: FormEvent) {
    e.preventDefault();
    create.mutate(name.trim(), { onSuccess: (p) => void navigate(teamProgramHref(p.id)) });
  }

  return (
    <div className="space-y-3">
      {programs.isPending ? (
        <Loading what="team programs" />
      ) : programs.isError ? (
        <ErrorNotice error={programs.error} />
      ) : programs.data.length === 0 ? (
        <p className="text-sm text-muted">No team program for this group yet.</p>
      ) : (
        <ul className="list-disc pl-5">
          {programs.data.map((p) => (
            <li key={p.id}>
              <Link to={teamProgramHref(p.id)}>{p.name}</Link>{' '}
              <span className="text-sm text-muted">
                ({p.sessions} {p.sessions === 1 ? 'session' : 'sessions'})
              </span>
            </li>
          ))}
        </ul>
      )}
      {canStart && (
        <form onSubmit={submit} noValidate className="flex flex-wrap items-end gap-3" aria-label="New team program">
          <ErrorNotice error={nameError ? null : create.error} />
          <TextField
            label="New team program"
            value={name}
            onChange={(e) => setName(e.target.value)}
            maxLength={120}
            error={nameError}
            className="min-w-64"
          />
          <Button type="submit" busy={create.isPending} disabled={name.trim() === ''}>
            Start team program
          </Button>
        </form>
      )}
    </div>
  );
}
