import type { DataSource, EntityManager } from 'typeorm';
import type { OrganizationDto, OrganizationSettingsDto } from '../../../policies/dto';
import { followsCountry } from '../../../policies/emergency-numbers';
import { letterPaperOf } from '../../../policies/letter-paper';
import { Organization } from '../entities';
import { authorize } from '../core/authorize';
import { orgQuery } from '../core/command';

export function toOrganizationDto(org: Organization): OrganizationDto {
  return { id: org.id, name: org.name, emergencyNumber: org.emergencyNumber, timeZone: org.timeZone };
}

export function toSettingsDto(org: Organization): OrganizationSettingsDto {
  return {
    ...toOrganizationDto(org),
    guardiansSeeClips: org.guardiansSeeClips,
    letterPaper: org.letterPaper,
    letterPaperInUse: letterPaperOf(org),
    country: org.country,
    emergencyNumberFollowsCountry: followsCountry(org),
    version: org.version,
  };
}

export function loadOrganization(db: DataSource | EntityManager, id: string): Promise<Organization | null> {
  return db.getRepository(Organization).findOneBy({ id });
}

/** The reader's organization: its name, local emergency number and time zone. */
export const getOrganization = orgQuery({
  name: 'getOrganization',
  async run(ctx, _input: void): Promise<OrganizationDto> {
    const org = await loadOrganization(ctx.db, ctx.actor.organizationId);
    authorize(ctx.ability, 'read', 'Organization', org);
    return toOrganizationDto(org);
  },
});

/** The settings an admin edits, with the version an edit must name. */
export const getOrganizationSettings = orgQuery({
  name: 'getOrganizationSettings',
  async run(ctx, _input: void): Promise<OrganizationSettingsDto> {
    const org = await loadOrganization(ctx.db, ctx.actor.organizationId);
    authorize(ctx.ability, 'update', 'Organization', org);
    return toSettingsDto(org);
  },
});
