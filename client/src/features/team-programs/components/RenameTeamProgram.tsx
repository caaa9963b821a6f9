import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { zodResolver } from '@hookform/resolvers/zod';
import type { TeamProgramDto } from '../../../../../policies/dto/teams';
import { TeamProgramRenameSchema } from '../../../../../policies/schemas/team-programs';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { isApiError } from '../../../lib/api-client';
import { applyServerFieldErrors, fieldSentence } from '../../../lib/form-errors';
import { useRenameTeamProgram } from '../api/team-programs';

const NameSchema = z.strictObject({ name: TeamProgramRenameSchema.shape.name });
type NameInput = z.infer<typeof NameSchema>;

export const STALE_PROGRAM =
  'Someone else changed this team program since you opened it. Reload it to see the latest, then rename it again if you still want to.';

/**
 * The team program's name, and a small form to change it. The athletes see the name on their own
 * versions, so it is renamed everywhere at once (the server does that). A stale rename (409) is not
 * retried: the coach reloads first.
 */
export function RenameTeamProgram({
  orgId,
  program,
  onReload,
}: {
  orgId: string;
  program: Pick<TeamProgramDto, 'id' | 'name' | 'version'>;
  onReload: () => Promise<void> | void;
}) {
  const [open, setOpen] = useState(false);
  const [renamed, setRenamed] = useState<string | null>(null);
  const rename = useRenameTeamProgram(orgId, program.id);
  const { register, handleSubmit, reset, setError, formState } = useForm<NameInput>({
    resolver: zodResolver(NameSchema),
    defaultValues: { name: program.name },
  });
  const stale = isApiError(rename.error) && rename.error.code === 'version_conflict';

  const start = () => {
    rename.reset();
    setRenamed(null);
    reset({ name: program.name });
    setOpen(true);
  };
  const onSubmit = handleSubmit((input) =>
    rename.mutate(
      { name: input.name, version: program.version },
      {
        onSuccess: (dto) => {
          setOpen(false);
          setRenamed(dto.name);
        },
        onError: (error) => applyServerFieldErrors(error, setError, ['name']),
      },
    ),
  );

  if (!open)
    return (
      <div className="space-y-2">
        <Button size="sm" variant="secondary" onClick={start}>
          Rename this program
        </Button>
        <div role="status">{renamed && <Notice tone="done" title={`Renamed to “${renamed}”`} />}</div>
      </div>
    );
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Rename the team program" className="space-y-2">
      <TextField
        label="Program name"
        hint="The athletes see this name on their own sessions."
        autoFocus
        error={fieldSentence('Program name', formState.errors.name?.message)}
        {...register('name')}
      />
      {stale ? (
        <Notice tone="problem" role="alert" title="Not renamed">
          <p>{STALE_PROGRAM}</p>
          <Button
            size="sm"
            variant="secondary"
            className="mt-2"
            onClick={async () => {
              await onReload();
              setOpen(false);
              rename.reset();
            }}
          >
            Reload the team program
          </Button>
        </Notice>
      ) : (
        rename.isError && <ErrorNotice error={rename.error} title="Not renamed" />
      )}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" size="sm" busy={rename.isPending} disabled={stale}>
          Save the name
        </Button>
        <Button size="sm" variant="secondary" onClick={() => setOpen(false)}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
