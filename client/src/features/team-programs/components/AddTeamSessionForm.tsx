import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { zodResolver } from '@hookform/resolvers/zod';
import type { ProgramSessionDto } from '../../../../../policies/dto';
import { SessionCreateSchema, type SessionCreateInput } from '../../../../../policies/schemas';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { ErrorNotice } from '../../../components/ui/Notice';
import { addDaysIso, todayLocal } from '../../../lib/dates';
import { useAddTeamSession } from '../api/team-programs';

/** A dated, titled team session; its exercises and sets are written in the editor that opens next. */
export function AddTeamSessionForm({
  orgId,
  programId,
  lastDate,
  onAdded,
}: {
  orgId: string;
  programId: string;
  lastDate: string | null;
  onAdded: (session: ProgramSessionDto) => void;
}) {
  const add = useAddTeamSession(orgId, programId);
  const today = todayLocal();
  const next = lastDate && lastDate >= today ? addDaysIso(lastDate, 2) : today;
  const { register, handleSubmit, reset, formState } = useForm<z.input<typeof SessionCreateSchema>, unknown, SessionCreateInput>({
    resolver: zodResolver(SessionCreateSchema),
    defaultValues: { date: next, title: '', content: { exercises: [] } },
  });
  const onSubmit = handleSubmit((input) =>
    add.mutate(input, {
      onSuccess: (session) => {
        reset({ date: addDaysIso(session.date, 2), title: '', content: { exercises: [] } });
        onAdded(session);
      },
    }),
  );
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Add a team session" className="space-y-2">
      <h2 className="font-bold">Add a team session</h2>
      <div className="flex flex-wrap gap-2">
        <TextField label="Session date" type="date" className="w-40" error={formState.errors.date?.message} {...register('date')} />
        <TextField
          label="Session title"
          className="min-w-[9rem] flex-1"
          placeholder="e.g. Squad strength"
          error={formState.errors.title?.message}
          {...register('title')}
        />
      </div>
      <Button type="submit" size="sm" busy={add.isPending}>
        Add team session
      </Button>
      {add.isError && <ErrorNotice error={add.error} />}
    </form>
  );
}
