import { Outlet } from 'react-router-dom';
import { SectionNav } from '../../../components/ui/SectionNav';
import { RoleGate } from '../../layout/RoleGate';

const LINKS = [
  { to: '/admin/people', label: 'People' },
  { to: '/groups', label: 'Groups' },
  { to: '/admin/invitations', label: 'Invitations' },
  { to: '/admin/roster-import', label: 'Bring a roster' },
  { to: '/admin/audit', label: 'Audit trail' },
  { to: '/admin/injury-report', label: 'Injury report' },
  { to: '/admin/plan-templates', label: 'Plan templates' },
  { to: '/admin/outbox', label: 'Outbox' },
  { to: '/admin/settings', label: 'Organization settings' },
];

export const personHref = (id: string) => `/admin/people/${id}`;

export function AdminLayout() {
  return (
    <RoleGate role="admin">
      <SectionNav label="Administration" links={LINKS} />
      <Outlet />
    </RoleGate>
  );
}
