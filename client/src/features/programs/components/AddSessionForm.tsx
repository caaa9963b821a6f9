import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { zodResolver } from '@hookform/resolvers/zod';
import type { ProgramSessionDto } from '../../../../../policies/dto';
import { SessionCreateSchema, type SessionCreateInput } from '../../../../../policies/schemas';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { ErrorNotice } from '../../../components/ui/Notice';
import { addDaysIso, todayLocal } from '../../../lib/dates';
import { useCreateSession } from '../api/sessions';

/** A dated, titled draft; its exercises are added in the session editor. */
export function AddSessionForm({
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
  const create = useCreateSession(orgId, programId);
  const today = todayLocal();
  const next = lastDate && lastDate >= today ? addDaysIso(lastDate, 2) : today;
  const { register, handleSubmit, reset, formState } = useForm<z.input<typeof SessionCreateSchema>, unknown, SessionCreateInput>({
    resolver: zodResolver(SessionCreateSchema),
    defaultValues: { date: next, title: '', content: { exercises: [] } },
  });

  const onSubmit = handleSubmit((input) =>
    create.mutate(input, {
      onSuccess: (session) => {
        reset({ date: addDaysIso(session.date, 2), title: '', content: { exercises: [] } });
        onAdded(session);
      },
    }),
  );

  return (
    <form onSubmit={onSubmit} noValidate aria-label="New session" className="space-y-2">
      <div className="flex flex-wrap gap-2">
        <TextField label="Session date" type="date" className="w-40" error={formState.errors.date?.message} {...register('date')} />
        <TextField
          label="Session title"
          className="min-w-[9rem] flex-1"
          placeholder="e.g. Lower A"
          error={formState.errors.title?.message}
          {...register('title')}
        />
      </div>
      <Button type="submit" size="sm" busy={create.isPending}>
        Add session
      </Button>
      {create.isError && <ErrorNotice error={create.error} />}
    </form>
  );
}
