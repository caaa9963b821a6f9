import { useMemo } from 'react';
import { Navigate, Outlet, useLocation } from 'react-router-dom';
import { AbilityProvider } from '@casl/react';
import { defineAbilityFor } from '../../../../policies/access';
import type { SessionDto, UserDto, MembershipSummaryDto } from '../../../../policies/dto';
import { useSession } from '../../features/auth/api/get-session';
import { useSignOut } from '../../features/auth/api/sign-out';
import { useOutboxSync } from '../../features/offline/use-outbox-sync';
import { setOrgTimeZone } from '../../lib/dates';
import { MembershipContext } from '../../lib/membership-context';
import { useActiveOrg } from '../active-org';
import { AppHeader, Unaffiliated } from './AppHeader';

/**
 * The gate for everything behind sign-in. A signed-out visitor goes to the sign-in page and comes
 * back afterwards. The CASL ability is built from the session's actor, the same rules the server uses.
 */
export function SignedInLayout() {
  const session = useSession();
  const location = useLocation();
  // Owned here rather than by the header, so the redirect below can tell a deliberate sign-out (go
  // to the sign-in page, forget this page) from a session that ended (come back here afterwards).
  const signOut = useSignOut();
  const data = session.data as SessionDto;

  if (!data.user) {
    const leaving = signOut.isPending || signOut.isSuccess;
    return <Navigate to="/sign-in" replace state={leaving ? null : { from: `${location.pathname}${location.search}` }} />;
  }
  return <Member user={data.user} memberships={data.memberships} signOut={signOut} />;
}

function Member({
  user,
  memberships,
  signOut,
}: {
  user: UserDto;
  memberships: MembershipSummaryDto[];
  signOut: ReturnType<typeof useSignOut>;
}) {
  const { membership, choose } = useActiveOrg(memberships);
  useOutboxSync(user.id);
  // Set before the pages below render, so their "today" and their times count in this organization's zone.
  setOrgTimeZone(membership?.timeZone ?? null);
  const ability = useMemo(() => defineAbilityFor(membership?.actor ?? null), [membership]);
  const current = useMemo(() => (membership ? { user, membership, orgId: membership.organizationId } : null), [user, membership]);

  return (
    <AbilityProvider value={ability}>
      <MembershipContext.Provider value={current}>
        <AppHeader user={user} membership={membership} memberships={memberships} onChooseOrg={choose} signOut={signOut} />
        <main id="main" tabIndex={-1} className="mx-auto w-full max-w-6xl px-4 py-6 focus:outline-none">
          {current ? <Outlet /> : <UnaffiliatedOrAccount />}
        </main>
      </MembershipContext.Provider>
    </AbilityProvider>
  );
}

/** Without an organization, only the account page still makes sense. */
function UnaffiliatedOrAccount() {
  const location = useLocation();
  return location.pathname === '/account' ? <Outlet /> : <Unaffiliated />;
}
