import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { CareTeamAssignmentCreateSchema } from '../../../../../policies/schemas';
import { CARE_TEAM_ROLES, ROLE_LABELS, type Role } from '../../../../../policies/roles';
import type { AthleteProfileDto } from '../../../../../policies/dto';
import { useAppAbility } from '../../../lib/ability';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { Button } from '../../../components/ui/Button';
import { SelectField } from '../../../components/ui/Field';
import { ErrorNotice } from '../../../components/ui/Notice';
import { useAssignCareTeam } from '../api/assign-care-team';
import { useRemoveCareTeamAssignment } from '../api/remove-care-team';

type Input = z.input<typeof CareTeamAssignmentCreateSchema>;
type Output = z.output<typeof CareTeamAssignmentCreateSchema>;

export interface Candidate {
  id: string;
  displayName: string;
  roles: Role[];
}

export function CareTeamEditor({ orgId, athlete, candidates }: { orgId: string; athlete: AthleteProfileDto; candidates: Candidate[] }) {
  const ability = useAppAbility();
  const assign = useAssignCareTeam(orgId);
  const remove = useRemoveCareTeamAssignment(orgId);
  const canAssign = ability.can('create', 'CareTeamAssignment');
  const canRemove = ability.can('delete', 'CareTeamAssignment');

  const {
    register,
    control,
    handleSubmit,
    setError,
    setValue,
    reset,
    formState: { errors },
  } = useForm<Input, unknown, Output>({
    resolver: zodResolver(CareTeamAssignmentCreateSchema),
    defaultValues: { athleteId: athlete.id, memberId: '', role: 'clinician' },
  });
  const role = useWatch({ control, name: 'role' });
  const memberId = useWatch({ control, name: 'memberId' });

  const taken = new Set(athlete.careTeam.filter((m) => m.role === role).map((m) => m.memberId));
  const choices = candidates
    .filter((c) => c.id !== athlete.id && c.roles.includes(role) && !taken.has(c.id))
    .sort((a, b) => a.displayName.localeCompare(b.displayName));

  const onSubmit = handleSubmit((values) =>
    assign.mutate(values, {
      onSuccess: () => reset({ athleteId: athlete.id, memberId: '', role: values.role }),
      onError: (error) => applyServerFieldErrors(error, setError, ['memberId', 'role']),
    }),
  );

  return (
    <div className="space-y-4">
      <ErrorNotice error={remove.error} />
      {athlete.careTeam.length === 0 ? (
        <p className="text-sm text-ink-2">Nobody is on {athlete.displayName}&apos;s care team yet.</p>
      ) : (
        <ul className="divide-y divide-rule rounded-md border border-rule">
          {athlete.careTeam.map((member) => (
            <li key={member.id} className="flex flex-wrap items-center justify-between gap-2 px-3 py-2 text-sm">
              <span>
                <span className="font-semibold">{member.memberName}</span> <span className="text-ink-2">· {ROLE_LABELS[member.role]}</span>
              </span>
              {canRemove && (
                <Button
                  variant="danger"
                  size="sm"
                  busy={remove.isPending && remove.variables === member.id}
                  aria-label={`Remove ${member.memberName} (${ROLE_LABELS[member.role].toLowerCase()}) from the care team`}
                  onClick={() => remove.mutate(member.id)}
                >
                  Remove
                </Button>
              )}
            </li>
          ))}
        </ul>
      )}

      {canAssign && (
        <form onSubmit={onSubmit} noValidate className="space-y-3" aria-label="Add to care team">
          <ErrorNotice error={assign.error} />
          <input type="hidden" {...register('athleteId')} />
          <div className="grid gap-3 sm:grid-cols-2">
            <SelectField
              label="Care-team role"
              error={errors.role?.message}
              {...register('role', { onChange: () => setValue('memberId', '') })}
            >
              {CARE_TEAM_ROLES.map((r) => (
                <option key={r} value={r}>
                  {ROLE_LABELS[r]}
                </option>
              ))}
            </SelectField>
            <SelectField
              label="Person"
              hint={choices.length === 0 ? `Nobody else here holds the ${ROLE_LABELS[role].toLowerCase()} role.` : undefined}
              error={memberId ? errors.memberId?.message : errors.memberId && 'Choose a person first.'}
              {...register('memberId')}
            >
              <option value="">Choose…</option>
              {choices.map((c) => (
                <option key={c.id} value={c.id}>
                  {c.displayName}
                </option>
              ))}
            </SelectField>
          </div>
          <Button type="submit" variant="secondary" busy={assign.isPending}>
            Add to care team
          </Button>
        </form>
      )}
    </div>
  );
}
