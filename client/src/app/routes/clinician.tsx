import { ComingLater, PageHeader } from '../../components/ui/Panel';
import { useDocumentTitle } from '../../lib/use-document-title';
import { RoleGate } from '../layout/RoleGate';
import { MarksLegend } from './legend';
import { StaffRoster } from './staff-roster';

export function ClinicianHome() {
  useDocumentTitle('My caseload');
  return (
    <RoleGate role="clinician">
      <div className="space-y-5">
        <PageHeader title="My caseload">Athletes whose care team you are on as their clinician.</PageHeader>
        <StaffRoster
          role="clinician"
          caption="Athletes in your care"
          empty="You are not on any athlete's care team yet. Your organization's administrator adds clinicians to care teams."
        />
        <ComingLater title="Cases and restriction plans arrive in a coming release">
          <p>
            Opening a case, setting participation status, drawing caps by stage and date, and review dates come
            next, followed by pain reports and clearance letters.
          </p>
          <MarksLegend />
        </ComingLater>
      </div>
    </RoleGate>
  );
}
