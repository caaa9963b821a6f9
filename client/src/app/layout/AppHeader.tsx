import { useId } from 'react';
import { Link, NavLink, useNavigate } from 'react-router-dom';
import type { MembershipSummaryDto, UserDto } from '../../../../policies/dto';
import { ROLE_LABELS } from '../../../../policies/roles';
import type { useSignOut } from '../../features/auth/api/sign-out';
import { NoticesLink } from '../../features/notifications/components/NoticesLink';
import { Button } from '../../components/ui/Button';
import { ErrorNotice } from '../../components/ui/Notice';
import { cx } from '../../components/ui/cx';
import { ROLE_VIEWS, orderedRoles } from '../role-views';
import { Brand } from './Brand';

export function AppHeader({
  user,
  membership,
  memberships,
  onChooseOrg,
  signOut,
}: {
  user: UserDto;
  membership: MembershipSummaryDto | null;
  memberships: MembershipSummaryDto[];
  onChooseOrg: (orgId: string) => void;
  /** Owned by the signed-in layout; when it succeeds, the layout sends the person to the sign-in page. */
  signOut: ReturnType<typeof useSignOut>;
}) {
  const navigate = useNavigate();
  const orgSelectId = useId();
  const roles = membership ? orderedRoles(membership.roles) : [];

  return (
    <header className="border-b border-rule bg-sheet">
      <div className="mx-auto flex max-w-6xl flex-wrap items-center justify-between gap-x-6 gap-y-2 px-4 py-3">
        <div className="flex min-w-0 flex-wrap items-center gap-x-4 gap-y-1">
          <Brand />
          {memberships.length > 1 ? (
            <div className="flex items-center gap-2 text-sm">
              <label htmlFor={orgSelectId} className="text-muted">
                Organization
              </label>
              <select
                id={orgSelectId}
                value={membership?.organizationId}
                onChange={(e) => {
                  onChooseOrg(e.target.value);
                  navigate('/');
                }}
                className="min-h-9 rounded-md border border-rule-strong bg-sheet px-2"
              >
                {memberships.map((m) => (
                  <option key={m.organizationId} value={m.organizationId}>
                    {m.organizationName}
                  </option>
                ))}
              </select>
            </div>
          ) : (
            membership && <span className="text-sm text-ink-2">{membership.organizationName}</span>
          )}
        </div>

        <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
          <div className="min-w-0 text-sm leading-tight">
            <p className="font-semibold">
              <span className="sr-only">Signed in as </span>
              {user.displayName}
            </p>
            <p className="break-all text-muted">
              {user.email}
              {roles.length > 0 && <> · {roles.map((r) => ROLE_LABELS[r]).join(', ')}</>}
            </p>
          </div>
          <div className="flex items-center gap-2">
            {membership && <NoticesLink orgId={membership.organizationId} />}
            <NavLink
              to="/account"
              className={({ isActive }) => cx('rounded px-1 text-sm font-semibold', isActive && 'underline decoration-line decoration-2')}
            >
              Account
            </NavLink>
            <Button variant="secondary" size="sm" busy={signOut.isPending} onClick={() => signOut.mutate()}>
              Sign out
            </Button>
          </div>
        </div>
      </div>
      {signOut.isError && (
        <div className="mx-auto max-w-6xl px-4 pb-3">
          <ErrorNotice error={signOut.error} />
        </div>
      )}
      {roles.length > 1 && (
        <nav aria-label="Your views" className="mx-auto max-w-6xl overflow-x-auto px-4">
          <ul className="flex gap-1">
            {roles.map((role) => (
              <li key={role}>
                <NavLink
                  to={ROLE_VIEWS[role].path}
                  className={({ isActive }) =>
                    cx(
                      'inline-flex min-h-11 items-center border-b-4 px-3 text-sm font-semibold whitespace-nowrap no-underline',
                      isActive ? 'border-line text-ink' : 'border-transparent text-ink-2 hover:border-rule-strong',
                    )
                  }
                >
                  {ROLE_VIEWS[role].tab}
                </NavLink>
              </li>
            ))}
          </ul>
        </nav>
      )}
    </header>
  );
}

export function Unaffiliated() {
  return (
    <p className="text-sm">
      You are signed in, but you are not part of any organization right now. If you expected to be, ask your organization&apos;s
      administrator for an invitation. <Link to="/account">Your account</Link> is still available.
    </p>
  );
}
