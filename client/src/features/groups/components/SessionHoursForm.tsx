import { useState, type FormEvent } from 'react';
import type { GroupDto } from '../../../../../policies/dto/teams';
import type { TeamSessionKind } from '../../../../../policies/schemas/injury-report';
import { Button } from '../../../components/ui/Button';
import { CheckboxGroup, RadioGroup, TextField } from '../../../components/ui/Field';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { isApiError } from '../../../lib/api-client';
import { todayLocal } from '../../../lib/dates';
import { humanDate } from '../../../../../policies/words/dates';
import { useRecordSessionHours } from '../../injury-report/api/injury-report';

/**
 * Record a practice or competition for the whole group in one step (exposure for the injury report):
 * everyone is ticked as present; untick whoever was absent.
 */
export function SessionHoursForm({ orgId, group }: { orgId: string; group: GroupDto }) {
  const record = useRecordSessionHours(orgId, group.id);
  const [date, setDate] = useState(todayLocal());
  const [minutes, setMinutes] = useState('90');
  const [kind, setKind] = useState<TeamSessionKind>('practice');
  const [present, setPresent] = useState<string[]>(group.athletes.map((a) => a.id));
  const fields = isApiError(record.error) ? record.error.fields : {};

  function submit(e: FormEvent) {
    e.preventDefault();
    record.mutate({ date, minutes: Number(minutes), kind, athleteIds: present });
  }

  return (
    <form onSubmit={submit} noValidate className="space-y-3" aria-label="Session hours">
      <p className="text-sm text-muted">
        Practice and competition time counts as exposure in the organization&apos;s injury report. Everyone is ticked; untick whoever was
        absent.
      </p>
      <ErrorNotice error={Object.keys(fields).length ? null : record.error} />
      {record.isSuccess && (
        <Notice tone="info" title="Recorded">
          {record.data.minutes} minutes of {record.data.kind} on {humanDate(record.data.date)} for {record.data.present}{' '}
          {record.data.present === 1 ? 'athlete' : 'athletes'}.
        </Notice>
      )}
      <div className="flex flex-wrap items-end gap-3">
        <TextField label="Date" type="date" value={date} onChange={(e) => setDate(e.target.value)} error={fields.date?.[0]} />
        <TextField
          label="Minutes"
          type="number"
          inputMode="numeric"
          min={1}
          max={600}
          value={minutes}
          onChange={(e) => setMinutes(e.target.value)}
          error={fields.minutes?.[0]}
          className="w-28"
        />
        <RadioGroup
          legend="Kind"
          name="session-kind"
          options={[
            { value: 'practice', label: 'Practice' },
            { value: 'competition', label: 'Competition' },
          ]}
          value={kind}
          onChange={setKind}
          error={fields.kind?.[0]}
        />
      </div>
      <CheckboxGroup
        legend="Present"
        name="present"
        options={group.athletes.map((a) => ({ value: a.id, label: a.name }))}
        value={present}
        onChange={setPresent}
        error={fields.athleteIds?.[0]}
      />
      <Button type="submit" busy={record.isPending} disabled={present.length === 0}>
        Record session hours
      </Button>
    </form>
  );
}
