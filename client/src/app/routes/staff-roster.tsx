import type { CareTeamRole } from '../../../../policies/roles';
import { useAthletes } from '../../features/athletes/api/get-athletes';
import { AthleteTable } from '../../features/athletes/components/AthleteTable';
import { useCurrentMembership } from '../../lib/membership-context';
import { ErrorNotice } from '../../components/ui/Notice';
import { Loading } from '../../components/ui/Panel';

/**
 * The athletes whose care team includes this person in the given role. The server already limits
 * the list to what they may see; an admin sees everyone, so it is narrowed here to their own teams.
 */
export function StaffRoster({ role, caption, empty }: { role: CareTeamRole; caption: string; empty: string }) {
  const { orgId, membership } = useCurrentMembership();
  const athletes = useAthletes(orgId);
  if (athletes.isPending) return <Loading what="athletes" />;
  if (athletes.isError) return <ErrorNotice error={athletes.error} />;
  const mine = athletes.data.filter((a) => a.careTeam.some((m) => m.memberId === membership.id && m.role === role));
  return <AthleteTable athletes={mine} caption={caption} empty={empty} />;
}
