import { useNotifications } from '../../features/notifications/api/get-notifications';
import { EmailPreferences } from '../../features/notifications/components/EmailPreferences';
import { NoticeList } from '../../features/notifications/components/NoticeList';
import { useOrganization } from '../../features/organization/api/get-organization';
import { ErrorNotice } from '../../components/ui/Notice';
import { Loading, PageHeader, Panel } from '../../components/ui/Panel';
import { useCurrentMembership } from '../../lib/membership-context';
import { useDocumentTitle } from '../../lib/use-document-title';

/** Every role's notices: what happened about the athletes they look after, or to themselves. */
export function NoticesPage() {
  useDocumentTitle('Notices');
  const { orgId, membership } = useCurrentMembership();
  const notices = useNotifications(orgId);
  const organization = useOrganization(orgId);
  return (
    <div className="mx-auto max-w-3xl space-y-5">
      <PageHeader title="Notices">What Loadline has told you at {membership.organizationName}, newest first.</PageHeader>
      {notices.isPending ? (
        <Loading what="your notices" />
      ) : notices.isError ? (
        <ErrorNotice error={notices.error} />
      ) : (
        <NoticeList orgId={orgId} notices={notices.data} emergencyNumber={organization.data?.emergencyNumber} />
      )}
      <Panel title="E-mail me about">
        <EmailPreferences orgId={orgId} />
      </Panel>
    </div>
  );
}
