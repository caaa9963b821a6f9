import type { OrganizationSettingsDto } from '../../../policies/dto';
import type { OrganizationSettingsInput } from '../../../policies/schemas';
import { Organization } from '../entities';
import { authorize } from '../core/authorize';
import { orgCommand } from '../core/command';
import { updateVersioned } from '../services/versioned';
import { loadOrganization, toSettingsDto } from '../queries/organizations';

/**
 * An admin changes the organization's name, emergency number, whether guardians may watch clips, the
 * clearance letters' paper, or its time zone (whose calendar day is everyone's "today" from the next request on). The edit names
 * the version it was made against (409 when someone changed the settings meanwhile) and the entry
 * records every setting before and after.
 */
export const updateOrganizationSettings = orgCommand({
  name: 'updateOrganizationSettings',
  async run(ctx, input: OrganizationSettingsInput): Promise<OrganizationSettingsDto> {
    const { version, ...changes } = input;
    const org = await loadOrganization(ctx.m, ctx.actor.organizationId);
    authorize(ctx.ability, 'update', 'Organization', org);
    await updateVersioned(ctx.m, Organization, org.id, version, changes, 'organization settings');
    const before = {
      name: org.name,
      emergencyNumber: org.emergencyNumber,
      guardiansSeeClips: org.guardiansSeeClips,
      timeZone: org.timeZone,
      letterPaper: org.letterPaper,
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
