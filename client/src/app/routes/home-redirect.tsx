import { Navigate } from 'react-router-dom';
import { useCurrentMembership } from '../../lib/membership-context';
import { ROLE_VIEWS, defaultRole, recallView } from '../role-views';

/** '/' opens the most relevant view for this person in this organization. */
export function HomeRedirect() {
  const { membership, orgId } = useCurrentMembership();
  const role = defaultRole(membership.roles, recallView(orgId));
  if (!role) return <p className="text-sm">You hold no role in {membership.organizationName} yet.</p>;
  return <Navigate to={ROLE_VIEWS[role].path} replace />;
}
