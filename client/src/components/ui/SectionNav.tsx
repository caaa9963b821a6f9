import { NavLink } from 'react-router-dom';
import { cx } from './cx';

export interface SectionLink {
  to: string;
  label: string;
  /** Active only on this exact path (for a section's index page). */
  end?: boolean;
}

/** The short menu across the pages of one area (Administration, Clinic). */
export function SectionNav({ label, links }: { label: string; links: SectionLink[] }) {
  return (
    <nav aria-label={label} className="mb-5">
      <ul className="flex flex-wrap gap-2 text-sm">
        {links.map((link) => (
          <li key={link.to}>
            <NavLink
              to={link.to}
              end={link.end ?? false}
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
  );
}
