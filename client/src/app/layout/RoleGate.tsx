import { useEffect, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { ROLE_LABELS, type Role } from '../../../../policies/roles';
import { useCurrentMembership } from '../../lib/membership-context';
import { Notice } from '../../components/ui/Notice';
import { rememberView } from '../role-views';

/**
 * Shows a role's pages only to people holding that role here; anyone else reads why, in words.
 * The server refuses the data anyway — this only spares a screen of errors.
 */
export function RoleGate({ role, children }: { role: Role; children: ReactNode }) {
  const { membership, orgId } = useCurrentMembership();
  const allowed = membership.roles.includes(role);

  useEffect(() => {
    if (allowed) rememberView(orgId, role);
  }, [allowed, orgId, role]);

  if (!allowed) {
    return (
      <Notice tone="problem" role="alert" title="You can't do that">
        <p>
          You can&apos;t do that: this page is for people with the {ROLE_LABELS[role].toLowerCase()} role in {membership.organizationName},
          and you don&apos;t hold it.
        </p>
        <p>
          <Link to="/">Go to your home page</Link>
        </p>
      </Notice>
    );
  }
  return <>{children}</>;
}
