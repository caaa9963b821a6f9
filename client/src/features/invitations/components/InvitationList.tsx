import { ROLE_LABELS } from '../../../../../policies/roles';
import type { InvitationStatus } from '../../../../../policies/dto';
import { formatDateTime } from '../../../lib/format';
import { useAppAbility } from '../../../lib/ability';
import { Button } from '../../../components/ui/Button';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Loading } from '../../../components/ui/Panel';
import { useInvitations } from '../api/get-invitations';
import { useRevokeInvitation } from '../api/revoke-invitation';

const STATUS_WORDS: Record<InvitationStatus, string> = {
  pending: 'Waiting',
  accepted: 'Accepted',
  expired: 'Expired',
  revoked: 'Revoked',
};

export function InvitationList({ orgId, show }: { orgId: string; show: 'pending' | 'closed' }) {
  const invitations = useInvitations(orgId);
  const revoke = useRevokeInvitation(orgId);
  const ability = useAppAbility();

  if (invitations.isPending) return <Loading what="invitations" />;
  if (invitations.isError) return <ErrorNotice error={invitations.error} />;

  const rows = invitations.data.filter((i) => (show === 'pending' ? i.status === 'pending' : i.status !== 'pending'));
  const canRevoke = ability.can('delete', 'Invitation');
  if (rows.length === 0) {
    return (
      <p className="text-sm text-ink-2">{show === 'pending' ? 'No invitations are waiting to be accepted.' : 'No earlier invitations.'}</p>
    );
  }
  return (
    <div className="space-y-3">
      <ErrorNotice error={revoke.error} />
      <div
        role="region"
        tabIndex={0}
        // Named apart from the panel around it, which carries the plain title: two landmarks, two names.
        aria-label={show === 'pending' ? 'Table of pending invitations' : 'Table of earlier invitations'}
        className="overflow-x-auto rounded-lg border border-rule bg-sheet"
      >
        <table className="w-full min-w-[40rem] border-collapse text-left text-sm">
          <thead>
            <tr className="border-b border-rule bg-shade">
              <th scope="col" className="px-3 py-2">
                E-mail
              </th>
              <th scope="col" className="px-3 py-2">
                Roles
              </th>
              <th scope="col" className="px-3 py-2">
                Invited by
              </th>
              <th scope="col" className="px-3 py-2">
                {show === 'pending' ? 'Expires' : 'Status'}
              </th>
              {show === 'pending' && canRevoke && (
                <th scope="col" className="px-3 py-2">
                  <span className="sr-only">Actions</span>
                </th>
              )}
            </tr>
          </thead>
          <tbody>
            {rows.map((invitation) => (
              <tr key={invitation.id} className="border-b border-rule last:border-b-0">
                <td className="px-3 py-2">
                  {invitation.email}
                  {invitation.displayName && <span className="block text-muted">{invitation.displayName}</span>}
                </td>
                <td className="px-3 py-2">{invitation.roles.map((r) => ROLE_LABELS[r]).join(', ')}</td>
                <td className="px-3 py-2">{invitation.invitedByName ?? '—'}</td>
                <td className="px-3 py-2 whitespace-nowrap tabular-nums">
                  {show === 'pending' ? formatDateTime(invitation.expiresAt) : STATUS_WORDS[invitation.status]}
                </td>
                {show === 'pending' && canRevoke && (
                  <td className="px-3 py-2 text-right">
                    <Button
                      variant="danger"
                      size="sm"
                      busy={revoke.isPending && revoke.variables === invitation.id}
                      aria-label={`Revoke invitation for ${invitation.email}`}
                      onClick={() => revoke.mutate(invitation.id)}
                    >
                      Revoke
                    </Button>
                  </td>
                )}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
