import { NavLink, Outlet } from 'react-router-dom';
import { cx } from '../../../components/ui/cx';
import { RoleGate } from '../../layout/RoleGate';

const LINKS = [
  { to: '/clinician', label: 'Caseload', end: true },
  { to: '/staff/flags', label: 'Flags', end: false },
  { to: '/clinician/exceptions', label: 'Exception requests', end: false },
  { to: '/clinician/audit', label: 'Audit trail', end: false },
];

/** The clinician's pages share one gate and a short menu. */
export function ClinicianLayout() {
  return (
    <RoleGate role="clinician">
      <nav aria-label="Clinic" className="mb-5">
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
