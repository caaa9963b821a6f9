import { usePeople } from '../../../features/people/api/get-people';
import { PeopleTable } from '../../../features/people/components/PeopleTable';
import { ButtonLink } from '../../../components/ui/Button';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Loading, PageHeader } from '../../../components/ui/Panel';
import { useAppAbility } from '../../../lib/ability';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';
import { personHref } from './admin-layout';

export function PeoplePage() {
  useDocumentTitle('People');
  const { orgId, membership } = useCurrentMembership();
  const ability = useAppAbility();
  const people = usePeople(orgId);
  const needGuardian = (people.data ?? []).filter((p) => p.athlete?.needsGuardian);

  return (
    <div className="space-y-4">
      <PageHeader
        title="People"
        actions={
          ability.can('create', 'Invitation') && (
            <>
              <ButtonLink to="/admin/invitations" variant="primary">
                Invite someone
              </ButtonLink>
              <ButtonLink to="/admin/roster-import">Bring a roster</ButtonLink>
            </>
          )
        }
      >
        Everyone at {membership.organizationName}, their roles and their care teams.
      </PageHeader>
      {needGuardian.length > 0 && (
        <Notice tone="caution" title={`${needGuardian.length === 1 ? 'One minor needs' : `${needGuardian.length} minors need`} a guardian`}>
          <p>
            {needGuardian.map((p) => p.displayName).join(', ')} {needGuardian.length === 1 ? 'is' : 'are'} under 18 with no linked parent or
            guardian. Open the person to link one.
          </p>
        </Notice>
      )}
      {people.isPending ? (
        <Loading what="people" />
      ) : people.isError ? (
        <ErrorNotice error={people.error} />
      ) : (
        <PeopleTable people={people.data} personHref={personHref} />
      )}
    </div>
  );
}
