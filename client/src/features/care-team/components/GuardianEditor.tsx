import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { GuardianLinkCreateSchema } from '../../../../../policies/schemas';
import type { AthleteProfileDto } from '../../../../../policies/dto';
import { useAppAbility } from '../../../lib/ability';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { Button } from '../../../components/ui/Button';
import { SelectField } from '../../../components/ui/Field';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { useLinkGuardian } from '../api/link-guardian';
import { useUnlinkGuardian } from '../api/unlink-guardian';
import type { Candidate } from './CareTeamEditor';

type Input = z.input<typeof GuardianLinkCreateSchema>;
type Output = z.output<typeof GuardianLinkCreateSchema>;

export function GuardianEditor({ orgId, athlete, candidates }: { orgId: string; athlete: AthleteProfileDto; candidates: Candidate[] }) {
  const ability = useAppAbility();
  const link = useLinkGuardian(orgId);
  const unlink = useUnlinkGuardian(orgId);
  const canLink = ability.can('create', 'GuardianLink');
  const canUnlink = ability.can('delete', 'GuardianLink');

  const {
    register,
    control,
    handleSubmit,
    setError,
    reset,
    formState: { errors },
  } = useForm<Input, unknown, Output>({
    resolver: zodResolver(GuardianLinkCreateSchema),
    defaultValues: { athleteId: athlete.id, guardianId: '' },
  });
  const guardianId = useWatch({ control, name: 'guardianId' });

  const linked = new Set(athlete.guardians.map((g) => g.guardianId));
  const choices = candidates
    .filter((c) => c.id !== athlete.id && c.roles.includes('guardian') && !linked.has(c.id))
    .sort((a, b) => a.displayName.localeCompare(b.displayName));

  const onSubmit = handleSubmit((values) =>
    link.mutate(values, {
      onSuccess: () => reset({ athleteId: athlete.id, guardianId: '' }),
      onError: (error) => applyServerFieldErrors(error, setError, ['guardianId']),
    }),
  );

  return (
    <div className="space-y-4">
      {athlete.needsGuardian && (
        <Notice tone="caution" title="Needs a guardian">
          <p>
            {athlete.displayName} is under 18 and has no linked guardian. Link a parent or legal guardian so they receive what the care team
            decides.
          </p>
        </Notice>
      )}
      <ErrorNotice error={unlink.error} />
      {athlete.guardians.length === 0 ? (
        <p className="text-sm text-ink-2">No guardian is linked.</p>
      ) : (
        <ul className="divide-y divide-rule rounded-md border border-rule">
          {athlete.guardians.map((g) => (
            <li key={g.id} className="flex flex-wrap items-center justify-between gap-2 px-3 py-2 text-sm">
              <span className="font-semibold">{g.guardianName}</span>
              {canUnlink && (
                <Button
                  variant="danger"
                  size="sm"
                  busy={unlink.isPending && unlink.variables === g.id}
                  aria-label={`Unlink ${g.guardianName} as guardian`}
                  onClick={() => unlink.mutate(g.id)}
                >
                  Unlink
                </Button>
              )}
            </li>
          ))}
        </ul>
      )}

      {canLink && (
        <form onSubmit={onSubmit} noValidate className="space-y-3" aria-label="Link a guardian">
          <ErrorNotice error={link.error} />
          <input type="hidden" {...register('athleteId')} />
          <SelectField
            label="Guardian to link"
            className="max-w-sm"
            hint={choices.length === 0 ? 'Nobody else here holds the guardian role. Invite them first.' : undefined}
            error={guardianId ? errors.guardianId?.message : errors.guardianId && 'Choose a guardian first.'}
            {...register('guardianId')}
          >
            <option value="">Choose…</option>
            {choices.map((c) => (
              <option key={c.id} value={c.id}>
                {c.displayName}
              </option>
            ))}
          </SelectField>
          <Button type="submit" variant="secondary" busy={link.isPending}>
            Link guardian
          </Button>
        </form>
      )}
    </div>
  );
}
