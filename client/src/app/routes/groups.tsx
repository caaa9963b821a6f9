import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import type { GroupDto } from '../../../../policies/dto/teams';
import { GROUP_KIND_WORDS } from '../../../../policies/schemas/groups';
import { useAthletes } from '../../features/athletes/api/get-athletes';
import { usePeople } from '../../features/people/api/get-people';
import { useArchiveGroup, useGroup, useGroups } from '../../features/groups/api/groups';
import { GroupCreateForm } from '../../features/groups/components/GroupCreateForm';
import { GroupMembersEditor } from '../../features/groups/components/GroupMembersEditor';
import { GroupTeamPrograms } from '../../features/groups/components/GroupTeamPrograms';
import { SessionHoursForm } from '../../features/groups/components/SessionHoursForm';
import type { Candidate } from '../../features/groups/components/people-picks';
import { Button, ButtonLink } from '../../components/ui/Button';
import { ErrorNotice, Notice } from '../../components/ui/Notice';
import { Badge, Loading, PageHeader, Panel } from '../../components/ui/Panel';
import { useAppAbility } from '../../lib/ability';
import { useCurrentMembership } from '../../lib/membership-context';
import { useDocumentTitle } from '../../lib/use-document-title';

export const GROUPS_PATH = '/groups';
export const groupHref = (id: string) => `/groups/${id}`;

/**
 * Whom the reader may put in a group: an admin picks among everyone of the organization (and names
 * coaches), a coach among the athletes they already coach (the server refuses anyone else).
 */
function useCandidates(orgId: string, isAdmin: boolean): { athletes: Candidate[]; coaches: Candidate[]; pending: boolean } {
  const people = usePeople(orgId, { enabled: isAdmin });
  const athletes = useAthletes(orgId);
  const { membership } = useCurrentMembership();
  if (isAdmin) {
    const all = people.data ?? [];
    const pick = (role: 'athlete' | 'coach') => all.filter((p) => p.roles.includes(role)).map((p) => ({ id: p.id, name: p.displayName }));
    return { athletes: pick('athlete'), coaches: pick('coach'), pending: people.isPending };
  }
  const mine = (athletes.data ?? []).filter((a) => membership.actor.coachOf.includes(a.id)).map((a) => ({ id: a.id, name: a.displayName }));
  return { athletes: mine, coaches: [], pending: athletes.isPending };
}

function NoGroups() {
  return (
    <Notice tone="problem" role="alert" title="You can't do that">
      <p>Groups are for admins, coaches, and the clinicians of the athletes in them.</p>
      <p>
        <Link to="/">Go to your home page</Link>
      </p>
    </Notice>
  );
}

export function GroupsPage() {
  useDocumentTitle('Groups');
  const { orgId, membership } = useCurrentMembership();
  const ability = useAppAbility();
  const navigate = useNavigate();
  const isAdmin = membership.roles.includes('admin');
  const groups = useGroups(orgId);
  const candidates = useCandidates(orgId, isAdmin);
  if (!ability.can('read', 'Group')) return <NoGroups />;
  return (
    <div className="space-y-5">
      <PageHeader title="Groups">
        Teams, position groups and training blocks. A group&apos;s coaches see and program its athletes, as on a care team; an athlete may
        be in several groups.
      </PageHeader>
      {groups.isPending ? (
        <Loading what="groups" />
      ) : groups.isError ? (
        <ErrorNotice error={groups.error} />
      ) : groups.data.length === 0 ? (
        <p className="text-muted">No groups yet.</p>
      ) : (
        <ul className="divide-y divide-rule rounded-md border border-rule bg-sheet">
          {groups.data.map((g) => (
            <GroupRow key={g.id} group={g} />
          ))}
        </ul>
      )}
      {ability.can('create', 'Group') && (
        <Panel title="New group">
          {candidates.pending ? (
            <Loading what="people" />
          ) : (
            <GroupCreateForm
              orgId={orgId}
              athletes={candidates.athletes}
              coaches={isAdmin ? candidates.coaches : undefined}
              onCreated={(g) => void navigate(groupHref(g.id))}
            />
          )}
        </Panel>
      )}
    </div>
  );
}

function GroupRow({ group }: { group: GroupDto }) {
  return (
    <li className="flex flex-wrap items-baseline justify-between gap-2 px-4 py-3">
      <span>
        <Link to={groupHref(group.id)} className="font-semibold">
          {group.name}
        </Link>{' '}
        <span className="text-sm text-muted">{GROUP_KIND_WORDS[group.kind]}</span>
      </span>
      <span className="text-sm">
        {group.athletes.length} {group.athletes.length === 1 ? 'athlete' : 'athletes'} · coached by{' '}
        {group.coaches.map((c) => c.name).join(', ') || 'nobody yet'}
      </span>
    </li>
  );
}

export function GroupPage() {
  const { groupId = '' } = useParams();
  const { orgId, membership } = useCurrentMembership();
  const ability = useAppAbility();
  const group = useGroup(orgId, groupId);
  useDocumentTitle(group.data?.name ?? 'Group');
  const candidates = useCandidates(orgId, membership.roles.includes('admin'));
  if (!ability.can('read', 'Group')) return <NoGroups />;
  if (group.isPending) return <Loading what="the group" />;
  if (group.isError) return <ErrorNotice error={group.error} />;
  const g = group.data;
  return (
    <div className="space-y-5">
      <PageHeader
        title={g.name}
        actions={
          <ButtonLink to={GROUPS_PATH} variant="secondary">
            All groups
          </ButtonLink>
        }
      >
        {GROUP_KIND_WORDS[g.kind]} · {g.athletes.length} {g.athletes.length === 1 ? 'athlete' : 'athletes'}{' '}
        {g.archived && <Badge tone="warn">Archived</Badge>}
      </PageHeader>
      {/* Team programs are the coaches' work (read through Program): an admin who does not coach sees none. */}
      {ability.can('read', 'Program') && (
        <Panel title="Team programs">
          <GroupTeamPrograms orgId={orgId} groupId={g.id} canStart={g.canManage && ability.can('create', 'Program')} />
        </Panel>
      )}
      <Panel title="Members">
        {g.canManage ? (
          candidates.pending ? (
            <Loading what="people" />
          ) : (
            <GroupMembersEditor orgId={orgId} group={g} athletes={candidates.athletes} coaches={candidates.coaches} />
          )
        ) : (
          <div className="space-y-1 text-sm">
            <p>
              <span className="font-semibold">Coaches: </span>
              {g.coaches.map((c) => c.name).join(', ') || 'none'}
            </p>
            <p>
              <span className="font-semibold">Athletes: </span>
              {g.athletes.map((a) => a.name).join(', ') || 'none'}
            </p>
          </div>
        )}
      </Panel>
      {g.canManage && !g.archived && g.athletes.length > 0 && (
        <Panel title="Session hours">
          <SessionHoursForm orgId={orgId} group={g} />
        </Panel>
      )}
      {g.canManage && <ArchiveGroup orgId={orgId} group={g} />}
    </div>
  );
}

function ArchiveGroup({ orgId, group }: { orgId: string; group: GroupDto }) {
  const archive = useArchiveGroup(orgId, group.id);
  const [confirming, setConfirming] = useState(false);
  return (
    <Panel title="Archive">
      <p className="text-sm">
        An archived group is kept for the record; its coaches no longer see its athletes through it. Care teams are not changed.
      </p>
      <ErrorNotice error={archive.error} />
      {confirming ? (
        <div className="mt-2 flex flex-wrap gap-2" role="group" aria-label="Confirm archiving">
          <Button variant="danger" busy={archive.isPending} onClick={() => archive.mutate(group.version)}>
            Archive {group.name}
          </Button>
          <Button variant="secondary" onClick={() => setConfirming(false)} autoFocus>
            Keep it
          </Button>
        </div>
      ) : (
        <Button variant="secondary" className="mt-2" onClick={() => setConfirming(true)}>
          Archive this group
        </Button>
      )}
    </Panel>
  );
}
