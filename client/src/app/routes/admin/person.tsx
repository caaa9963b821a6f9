import { Link, useNavigate, useParams } from 'react-router-dom';
import type { PersonDto } from '../../../../../policies/dto';
import { ROLE_LABELS } from '../../../../../policies/roles';
import { usePerson } from '../../../features/people/api/get-person';
import { usePeople } from '../../../features/people/api/get-people';
import { PersonRolesForm, STALE_PERSON } from '../../../features/people/components/PersonRolesForm';
import { RemovePerson } from '../../../features/people/components/RemovePerson';
import { AthleteProfileForm } from '../../../features/athletes/components/AthleteProfileForm';
import { CareTeamEditor } from '../../../features/care-team/components/CareTeamEditor';
import { GuardianEditor } from '../../../features/care-team/components/GuardianEditor';
import { Badge, Facts, Loading, PageHeader, Panel } from '../../../components/ui/Panel';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { useAppAbility } from '../../../lib/ability';
import { orgDayOf } from '../../../lib/dates';
import { formatDate } from '../../../lib/format';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';
import { personHref } from './admin-layout';

export function PersonPage() {
  const { personId = '' } = useParams();
  const { orgId } = useCurrentMembership();
  const person = usePerson(orgId, personId);
  useDocumentTitle(person.data?.displayName ?? 'Person');

  return (
    <div className="space-y-5">
      <p className="text-sm">
        <Link to="/admin/people">← All people</Link>
      </p>
      {person.isPending ? (
        <Loading what="this person" />
      ) : person.isError ? (
        <ErrorNotice error={person.error} wording={{ notFound: 'This person is not in your organization (any more).' }} />
      ) : (
        <PersonDetail person={person.data} />
      )}
    </div>
  );
}

function PersonDetail({ person }: { person: PersonDto }) {
  const { orgId, membership } = useCurrentMembership();
  const ability = useAppAbility();
  const navigate = useNavigate();
  const people = usePeople(orgId);
  const everyone = people.data ?? [];
  const isSelf = person.id === membership.id;

  const caresFor = everyone.filter((p) => p.athlete?.careTeam.some((m) => m.memberId === person.id));
  const guardianOf = everyone.filter((p) => p.athlete?.guardians.some((g) => g.guardianId === person.id));

  return (
    <>
      <PageHeader title={person.displayName}>
        <span className="flex flex-wrap items-center gap-2">
          {person.roles.map((r) => ROLE_LABELS[r]).join(', ')}
          {person.athlete?.isMinor && <Badge>Minor</Badge>}
          {person.athlete?.needsGuardian && <Badge tone="warn">Needs a guardian</Badge>}
        </span>
      </PageHeader>

      <Panel title="Details">
        <Facts
          items={[
            { label: 'E-mail', value: person.email },
            { label: 'Joined', value: formatDate(orgDayOf(person.createdAt)) },
          ]}
        />
      </Panel>

      {ability.can('update', 'Membership') && (
        <Panel title="Roles">
          {isSelf && (
            <Notice tone="info" className="mb-3">
              <p>These are your own roles. Removing your admin role ends your access to these pages.</p>
            </Notice>
          )}
          <PersonRolesForm orgId={orgId} person={person} />
        </Panel>
      )}

      {person.roles.includes('athlete') && !person.athlete && (
        <Notice tone="caution">
          <p>This athlete has no athlete profile yet. Reload the page; if it stays missing, the server did not create one.</p>
        </Notice>
      )}

      {person.athlete && (
        <>
          {ability.can('update', 'Athlete') && (
            <Panel title="Athlete details">
              <AthleteProfileForm orgId={orgId} athlete={person.athlete} staleMessage={STALE_PERSON} />
            </Panel>
          )}
          <Panel title="Care team">
            <CareTeamEditor orgId={orgId} athlete={person.athlete} candidates={everyone} />
          </Panel>
          <Panel title="Guardians">
            <GuardianEditor orgId={orgId} athlete={person.athlete} candidates={everyone} />
          </Panel>
        </>
      )}

      {(caresFor.length > 0 || guardianOf.length > 0) && (
        <Panel title="Athletes around them">
          <ul className="space-y-1 text-sm">
            {caresFor.map((athlete) => (
              <li key={`team-${athlete.id}`}>
                <Link to={personHref(athlete.id)}>{athlete.displayName}</Link>{' '}
                <span className="text-ink-2">
                  · on the care team as{' '}
                  {athlete.athlete?.careTeam
                    .filter((m) => m.memberId === person.id)
                    .map((m) => ROLE_LABELS[m.role].toLowerCase())
                    .join(' and ')}
                </span>
              </li>
            ))}
            {guardianOf.map((athlete) => (
              <li key={`guardian-${athlete.id}`}>
                <Link to={personHref(athlete.id)}>{athlete.displayName}</Link> <span className="text-ink-2">· guardian</span>
              </li>
            ))}
          </ul>
        </Panel>
      )}

      {ability.can('delete', 'Membership') && !isSelf && (
        <Panel title="Remove from organization">
          <RemovePerson
            orgId={orgId}
            organizationName={membership.organizationName}
            person={person}
            onRemoved={() => navigate('/admin/people', { replace: true })}
          />
        </Panel>
      )}
    </>
  );
}
