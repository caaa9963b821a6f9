import { useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import type { GroupDto } from '../../../../../policies/dto/teams';
import { isApiError } from '../../../lib/api-client';
import { Button } from '../../../components/ui/Button';
import { CheckboxGroup } from '../../../components/ui/Field';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { groupKeys, useSetGroupMembers } from '../api/groups';
import { mergeCandidates, type Candidate } from './people-picks';

export const STALE_GROUP = 'Someone else changed this group; reload to see the latest.';

const sorted = (ids: string[]) => [...ids].sort().join(',');

/**
 * Who is in a group, saved with the version the editor saw (409 when someone else saved first).
 * Coaches are chosen by admins only (`canSetCoaches`); a coach keeps the athletes.
 */
export function GroupMembersEditor({
  orgId,
  group,
  athletes,
  coaches,
}: {
  orgId: string;
  group: GroupDto;
  /** Athletes the reader may add (a coach: the ones they coach; an admin: all). */
  athletes: Candidate[];
  coaches: Candidate[];
}) {
  const queryClient = useQueryClient();
  const save = useSetGroupMembers(orgId, group.id);
  const startCoaches = group.coaches.map((c) => c.id);
  const startAthletes = group.athletes.map((a) => a.id);
  const [coachIds, setCoachIds] = useState(startCoaches);
  const [athleteIds, setAthleteIds] = useState(startAthletes);
  // A fresh copy of the group (after a save or a reload) becomes the starting point (state adjusted
  // while rendering, as React advises, rather than in an effect).
  const [seenVersion, setSeenVersion] = useState(group.version);
  if (seenVersion !== group.version) {
    setSeenVersion(group.version);
    setCoachIds(startCoaches);
    setAthleteIds(startAthletes);
  }
  const dirty = sorted(coachIds) !== sorted(startCoaches) || sorted(athleteIds) !== sorted(startAthletes);
  const stale = isApiError(save.error) && save.error.code === 'version_conflict';
  const fields = isApiError(save.error) ? save.error.fields : {};
  const coachOptions = mergeCandidates(group.coaches, group.canSetCoaches ? coaches : []);
  const athleteOptions = mergeCandidates(group.athletes, athletes);

  async function reload() {
    await queryClient.invalidateQueries({ queryKey: groupKeys.one(orgId, group.id) });
    save.reset();
  }

  return (
    <form
      noValidate
      className="space-y-3"
      aria-label="Members"
      onSubmit={(e) => {
        e.preventDefault();
        save.mutate({ coachIds, athleteIds, version: group.version });
      }}
    >
      {stale ? (
        <Notice tone="problem" role="alert" title="Not saved">
          <p>{STALE_GROUP}</p>
          <Button variant="secondary" size="sm" className="mt-2" onClick={() => void reload()}>
            Reload this group
          </Button>
        </Notice>
      ) : (
        <ErrorNotice error={save.error} />
      )}
      {save.isSuccess && !dirty && (
        <Notice tone="done" role="status">
          <p>Members saved. Who sees whom follows at once.</p>
        </Notice>
      )}
      {group.canSetCoaches ? (
        <CheckboxGroup
          legend="Coaches"
          hint="They see and program the group's athletes, as on a care team."
          name="coachIds"
          options={coachOptions.map((c) => ({ value: c.id, label: c.name }))}
          value={coachIds}
          onChange={setCoachIds}
          error={fields.coachIds?.[0]}
        />
      ) : (
        <p className="text-sm">
          <span className="font-semibold">Coaches: </span>
          {group.coaches.map((c) => c.name).join(', ') || 'none yet'}
          <span className="block text-muted">An admin of your organization chooses a group&apos;s coaches.</span>
        </p>
      )}
      <CheckboxGroup
        legend="Athletes"
        hint="An athlete may be in several groups."
        name="athleteIds"
        options={athleteOptions.map((a) => ({ value: a.id, label: a.name }))}
        value={athleteIds}
        onChange={setAthleteIds}
        error={fields.athleteIds?.[0]}
      />
      <Button type="submit" busy={save.isPending} disabled={!dirty}>
        Save members
      </Button>
    </form>
  );
}
