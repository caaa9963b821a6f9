import type { OrganizationSettingsDto } from '../../../policies/dto';
import type { OrganizationCreateInput, OrganizationSettingsInput } from '../../../policies/schemas';
import { Invitation, Organization } from '../entities';
import { authorize } from '../core/authorize';
import { orgCommand, publicCommand } from '../core/command';
import { publicBaseUrl } from '../core/public-url';
import { newInvitationToken } from '../services/invitations';
import { emergencyNumberAfter } from '../../../policies/emergency-numbers';
import { startOrganization } from '../services/organizations';
import { updateVersioned } from '../services/versioned';
import { loadOrganization, toSettingsDto } from '../queries/organizations';

/**
 * An admin changes the organization's name, emergency number, whether guardians may watch clips, the
 * clearance letters' paper, its time zone (whose calendar day is everyone's "today" from the next request on)
 * or its country. A new country brings its emergency number unless the number was set by hand
 * (`emergencyNumberAfter`, shared with the form). The edit names the version it was made against (409
 * when someone changed the settings meanwhile) and the entry records every setting before and after.
 */
export const updateOrganizationSettings = orgCommand({
  name: 'updateOrganizationSettings',
  async run(ctx, input: OrganizationSettingsInput): Promise<OrganizationSettingsDto> {
    const { version, ...edit } = input;
    const org = await loadOrganization(ctx.m, ctx.actor.organizationId);
    authorize(ctx.ability, 'update', 'Organization', org);
    const changes = { ...edit, emergencyNumber: emergencyNumberAfter(org, edit) };
    await updateVersioned(ctx.m, Organization, org.id, version, changes, 'organization settings');
    const before = {
      name: org.name,
      emergencyNumber: org.emergencyNumber,
      guardiansSeeClips: org.guardiansSeeClips,
      timeZone: org.timeZone,
      letterPaper: org.letterPaper,
      country: org.country,
    };
    await ctx.audit({
      action: 'organization.settings_changed',
      subjectType: 'Organization',
      subjectId: org.id,
      before,
      after: { ...before, ...changes },
    });
    return toSettingsDto((await loadOrganization(ctx.m, org.id))!);
  },
});

/**
 * An operator creates an organization from the command line (`npm run org:create`) and invites its
 * first admin: the answer holds the one-time invitation link to hand over. The organization's chain
 * starts with `organization.created` (by no signed-in person, `via: 'operator'`), then the
 * invitation, as any admin's invitation is recorded. The link works once, for INVITATION_TTL_HOURS.
 */
export const createOrganizationByOperator = publicCommand({
  name: 'createOrganizationByOperator',
  async run(ctx, input: OrganizationCreateInput): Promise<{ organizationId: string; name: string; link: string; expiresAt: Date }> {
    const org = await startOrganization(
      ctx.m,
      ctx.audit,
      { name: input.name, country: input.country ?? null, timeZone: input.timeZone },
      { via: 'operator', actorUserId: null },
    );
    const { token, tokenHash } = newInvitationToken();
    const expiresAt = new Date(ctx.now.getTime() + ctx.deps.config.INVITATION_TTL_HOURS * 3_600_000);
    const invitation = await ctx.m.save(
      ctx.m.create(Invitation, {
        organizationId: org.id,
        email: input.adminEmail,
        roles: ['admin'],
        displayName: input.adminName ?? null,
        dateOfBirth: null,
        sport: null,
        tokenHash,
        expiresAt,
        invitedBy: null,
      }),
    );
    await ctx.audit({
      organizationId: org.id,
      actorUserId: null,
      action: 'invitation.created',
      subjectType: 'Invitation',
      subjectId: invitation.id,
      after: { email: invitation.email, roles: invitation.roles, expiresAt, via: 'operator' },
    });
    // The token rides in the fragment, which browsers never send to a server or in a Referer.
    return { organizationId: org.id, name: org.name, link: `${publicBaseUrl(ctx.deps.config)}/invite#${token}`, expiresAt };
  },
});
