import { ComingLater, PageHeader } from '../../components/ui/Panel';
import { useDocumentTitle } from '../../lib/use-document-title';
import { RoleGate } from '../layout/RoleGate';
import { MarksLegend } from './legend';
import { StaffRoster } from './staff-roster';

export function CoachHome() {
  useDocumentTitle('My athletes');
  return (
    <RoleGate role="coach">
      <div className="space-y-5">
        <PageHeader title="My athletes">Athletes whose care team you are on as their coach.</PageHeader>
        <StaffRoster
          role="coach"
          caption="Athletes you coach"
          empty="You are not on any athlete's care team yet. Your organization's administrator adds coaches to care teams."
        />
        <ComingLater title="Programs and caps arrive in a coming release">
          <p>
            Writing programs, and checking every planned set against the limits a clinician sets, come next. Until
            then, take each athlete&apos;s limits straight from their clinician.
          </p>
          <MarksLegend />
        </ComingLater>
      </div>
    </RoleGate>
  );
}
