import { RosterColumns } from '../../../features/roster-import/components/RosterColumns';
import { RosterImportFlow } from '../../../features/roster-import/components/RosterImportFlow';
import { PageHeader, Panel } from '../../../components/ui/Panel';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';

export function RosterImportPage() {
  useDocumentTitle('Bring a roster');
  const { orgId, membership } = useCurrentMembership();
  return (
    <div className="space-y-5">
      <PageHeader title="Bring a roster">
        Add many athletes to {membership.organizationName} at once from a spreadsheet. Checking a file writes nothing: you see every
        row&apos;s problems first. Importing adds the people and sends their invitations; importing the same file again changes nothing,
        because people are matched by e-mail.
      </PageHeader>
      <Panel title="The file">
        <RosterColumns orgId={orgId} />
      </Panel>
      <RosterImportFlow orgId={orgId} />
    </div>
  );
}
