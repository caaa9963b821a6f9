import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { Notice } from '../../../components/ui/Notice';
import { useCurrentMembership } from '../../../lib/membership-context';

/**
 * Pages for the people who train and treat athletes: coaches and clinicians. Anyone else reads why,
 * in words; the server refuses the data anyway.
 */
export function StaffGate({ children }: { children: ReactNode }) {
  const { membership } = useCurrentMembership();
  if (membership.roles.includes('coach') || membership.roles.includes('clinician')) return <>{children}</>;
  return (
    <Notice tone="problem" role="alert" title="You can't do that">
      <p>You can&apos;t do that: this page is for coaches and clinicians in {membership.organizationName}, and you hold neither role.</p>
      <p>
        <Link to="/">Go to your home page</Link>
      </p>
    </Notice>
  );
}
