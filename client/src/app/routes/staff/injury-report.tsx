import { Link } from 'react-router-dom';
import { InjuryReportView } from '../../../features/injury-report/components/InjuryReportView';
import { Notice } from '../../../components/ui/Notice';
import { PageHeader } from '../../../components/ui/Panel';
import { useAppAbility } from '../../../lib/ability';
import { useCurrentMembership } from '../../../lib/membership-context';
import { useDocumentTitle } from '../../../lib/use-document-title';

export const ADMIN_INJURY_REPORT_PATH = '/admin/injury-report';
export const CLINICIAN_INJURY_REPORT_PATH = '/clinician/injury-report';

/** The organization's injury report, for admins and clinicians (aggregates only). */
export function InjuryReportPage() {
  useDocumentTitle('Injury report');
  const { orgId } = useCurrentMembership();
  const ability = useAppAbility();
  if (!ability.can('read', 'InjuryReport'))
    return (
      <Notice tone="problem" role="alert" title="You can't do that">
        <p>The injury report is for admins and clinicians.</p>
        <p>
          <Link to="/">Go to your home page</Link>
        </p>
      </Notice>
    );
  return (
    <div className="space-y-5">
      <PageHeader title="Injury report">
        How many injuries the programme had over a period and how much training they cost, for the whole organization. No athlete is named,
        and small numbers are withheld.
      </PageHeader>
      <InjuryReportView orgId={orgId} />
    </div>
  );
}
