import { NavLink, Outlet } from 'react-router-dom';
import { cx } from '../../../components/ui/cx';
import { RoleGate } from '../../layout/RoleGate';

const LINKS = [
  { to: '/admin/people', label: 'People', end: false },
  { to: '/admin/invitations', label: 'Invitations', end: false },
  { to: '/admin/audit', label: 'Audit trail', end: false },
  { to: '/admin/outbox', label: 'Outbox', end: false },
];

export const personHref = (id: string) => `/admin/people/${id}`;

export function AdminLayout() {
  return (
    <RoleGate role="admin">
      <nav aria-label="Administration" className="mb-5">
        <ul className="flex flex-wrap gap-2 text-sm">
          {LINKS.map((link) => (
            <li key={link.to}>
              <NavLink
                to={link.to}
                end={link.end}
                className={({ isActive }) =>
                  cx(
                    'inline-flex min-h-9 items-center rounded-md border px-3 font-semibold no-underline',
                    isActive ? 'border-ink bg-ink text-paper' : 'border-rule-strong bg-sheet text-ink hover:bg-shade',
                  )
                }
              >
                {link.label}
              </NavLink>
            </li>
          ))}
        </ul>
      </nav>
      <Outlet />
    </RoleGate>
  );
}
