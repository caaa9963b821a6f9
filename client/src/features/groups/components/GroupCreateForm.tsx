import { useState, type FormEvent } from 'react';
import type { GroupDto } from '../../../../../policies/dto/teams';
import { GROUP_KIND_WORDS, GROUP_KINDS, type GroupKind } from '../../../../../policies/schemas/groups';
import { isApiError } from '../../../lib/api-client';
import { Button } from '../../../components/ui/Button';
import { CheckboxGroup, SelectField, TextField } from '../../../components/ui/Field';
import { ErrorNotice } from '../../../components/ui/Notice';
import { useCreateGroup } from '../api/groups';
import type { Candidate } from './people-picks';

/**
 * Starts a group. A coach picks among the athletes they coach and becomes the group's coach; an
 * admin picks among all athletes and may name its coaches (`coaches` is only passed to admins).
 */
export function GroupCreateForm({
  orgId,
  athletes,
  coaches,
  onCreated,
}: {
  orgId: string;
  athletes: Candidate[];
  coaches?: Candidate[];
  onCreated: (group: GroupDto) => void;
}) {
  const create = useCreateGroup(orgId);
  const [name, setName] = useState('');
  const [kind, setKind] = useState<GroupKind>('team');
  const [athleteIds, setAthleteIds] = useState<string[]>([]);
  const [coachIds, setCoachIds] = useState<string[]>([]);
  const fields = isApiError(create.error) ? create.error.fields : {};
  const nameError = name.trim() === '' && create.isError ? 'is required' : fields.name?.[0];

  function submit(e: FormEvent) {
    e.preventDefault();
    create.mutate(
      { name: name.trim(), kind, athleteIds, ...(coaches ? { coachIds } : {}) },
      {
        onSuccess: (group) => {
          setName('');
          setAthleteIds([]);
          setCoachIds([]);
          onCreated(group);
        },
      },
    );
  }

  return (
    <form onSubmit={submit} noValidate className="space-y-3" aria-label="New group">
      <ErrorNotice error={create.error} />
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField label="Group name" value={name} onChange={(e) => setName(e.target.value)} maxLength={120} error={nameError} />
        <SelectField label="Kind" value={kind} onChange={(e) => setKind(e.target.value as GroupKind)} error={fields.kind?.[0]}>
          {GROUP_KINDS.map((k) => (
            <option key={k} value={k}>
              {GROUP_KIND_WORDS[k]}
            </option>
          ))}
        </SelectField>
      </div>
      {coaches && (
        <CheckboxGroup
          legend="Coaches"
          hint="They see and program the group's athletes, as on a care team."
          name="coachIds"
          options={coaches.map((c) => ({ value: c.id, label: c.name }))}
          value={coachIds}
          onChange={setCoachIds}
          error={fields.coachIds?.[0]}
        />
      )}
      {athletes.length === 0 ? (
        <p className="text-sm text-muted">No athletes to pick yet: you can add them once the group exists.</p>
      ) : (
        <CheckboxGroup
          legend="Athletes"
          name="athleteIds"
          options={athletes.map((a) => ({ value: a.id, label: a.name }))}
          value={athleteIds}
          onChange={setAthleteIds}
          error={fields.athleteIds?.[0]}
        />
      )}
      <Button type="submit" busy={create.isPending}>
        Create group
      </Button>
    </form>
  );
}
