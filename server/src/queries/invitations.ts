import type { InvitationDto, InvitationPreviewDto } from '../../../policies/dto';
import { Invitation, Organization, User } from '../entities';
import { accessibleWhere } from '../core/accessible';
import { orgQuery, type CoreDeps } from '../core/command';
import { findUsableInvitation, toInvitationDto } from '../services/invitations';

/** The organization's invitations, newest first (the newest 500), with who sent each; never a token or its hash. */
export const listInvitations = orgQuery({
  name: 'listInvitations',
  async run(ctx, _input: void): Promise<InvitationDto[]> {
    const acl = accessibleWhere(ctx.ability, 'read', 'Invitation', { organizationId: 'i.organization_id' });
    const rows = await ctx.db
      .createQueryBuilder(Invitation, 'i')
      .leftJoinAndSelect('i.inviter', 'inviter')
      .where('i.organization_id = :org', { org: ctx.actor.organizationId })
      .andWhere(acl.sql, acl.params)
      .orderBy('i.created_at', 'DESC')
      .limit(500)
      .getMany();
    return rows.map((inv) => toInvitationDto(inv, inv.inviter?.displayName ?? null));
  },
});

/**
 * What an invitation link is for, told to whoever holds a usable link (nobody is signed in yet).
 * An unusable link answers one message whatever the reason (services/invitations.ts).
 */
export async function invitationPreview(deps: Pick<CoreDeps, 'ds'>, token: string): Promise<InvitationPreviewDto> {
  const m = deps.ds.manager;
  const inv = await findUsableInvitation(m, token, false);
  const org = await m.findOneByOrFail(Organization, { id: inv.organizationId });
  return {
    organizationName: org.name,
    email: inv.email,
    roles: inv.roles,
    displayName: inv.displayName,
    hasAccount: await m.exists(User, { where: { email: inv.email } }),
    expiresAt: inv.expiresAt.toISOString(),
  };
}
