import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { zodResolver } from '@hookform/resolvers/zod';
import type { UseMutationResult } from '@tanstack/react-query';
import type { ProgramSessionDto } from '../../../../../policies/dto';
import { SessionCreateSchema, type SessionCreateInput } from '../../../../../policies/schemas';
import { Button } from '../../../components/ui/Button';
import { TextField } from '../../../components/ui/Field';
import { ErrorNotice } from '../../../components/ui/Notice';
import { addDaysIso, todayLocal } from '../../../lib/dates';

/** What both add-a-session forms (one athlete's program, a team program) are given by their screen. */
export interface AddSessionProps {
  orgId: string;
  programId: string;
  lastDate: string | null;
  onAdded: (session: ProgramSessionDto) => void;
}

/**
 * A dated, titled, empty session: its exercises are written in the editor that opens next. The date
 * offered is today, or two days after the last session when that is later, and moves on two days
 * after each add, so a block of sessions is entered one after the other.
 */
export function DatedSessionForm({
  add,
  lastDate,
  onAdded,
  label,
  heading,
  placeholder,
  submitLabel,
}: Pick<AddSessionProps, 'lastDate' | 'onAdded'> & {
  /** The program's own add: the one-athlete program's or the team program's. */
  add: UseMutationResult<ProgramSessionDto, Error, SessionCreateInput>;
  /** The form's accessible name. */
  label: string;
  heading?: string;
  placeholder: string;
  submitLabel: string;
}) {
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
    <form onSubmit={onSubmit} noValidate aria-label={label} className="space-y-2">
      {heading && <h2 className="font-bold">{heading}</h2>}
      <div className="flex flex-wrap gap-2">
        <TextField label="Session date" type="date" className="w-40" error={formState.errors.date?.message} {...register('date')} />
        <TextField
          label="Session title"
          className="min-w-[9rem] flex-1"
          placeholder={placeholder}
          error={formState.errors.title?.message}
          {...register('title')}
        />
      </div>
      <Button type="submit" size="sm" busy={add.isPending}>
        {submitLabel}
      </Button>
      {add.isError && <ErrorNotice error={add.error} />}
    </form>
  );
}
