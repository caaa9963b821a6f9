import { useOrganizationSettings } from '../../../features/organization-settings/api/organization-settings';
import { OrganizationSettingsForm } from '../../../features/organization-settings/components/OrganizationSettingsForm';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Loading, PageHeader, Panel } from '../../../components/ui/Panel';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';

export function OrganizationSettingsPage() {
  useDocumentTitle('Organization settings');
  const { orgId } = useCurrentMembership();
  const settings = useOrganizationSettings(orgId);
  return (
    <>
      <PageHeader title="Organization settings">How {settings.data?.name ?? 'the organization'} appears, and who may see what.</PageHeader>
      <Panel className="max-w-2xl">
        {settings.isPending ? (
          <Loading what="the settings" />
        ) : settings.isError ? (
          <ErrorNotice error={settings.error} />
        ) : (
          <OrganizationSettingsForm orgId={orgId} settings={settings.data} />
        )}
      </Panel>
    </>
  );
}
