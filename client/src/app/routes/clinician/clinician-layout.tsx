import { Outlet } from 'react-router-dom';
import { SectionNav } from '../../../components/ui/SectionNav';
import { RoleGate } from '../../layout/RoleGate';

const LINKS = [
  { to: '/clinician', label: 'Caseload', end: true },
  { to: '/staff/flags', label: 'Flags', end: false },
  { to: '/clinician/exceptions', label: 'Exception requests', end: false },
  { to: '/clinician/audit', label: 'Audit trail', end: false },
  { to: '/clinician/injury-report', label: 'Injury report', end: false },
  { to: '/clinician/plan-templates', label: 'Plan templates', end: false },
];

/** The clinician's pages share one gate and a short menu. */
export function ClinicianLayout() {
  return (
    <RoleGate role="clinician">
      <SectionNav label="Clinic" links={LINKS} />
      <Outlet />
    </RoleGate>
  );
}
