import type { EntityManager } from 'typeorm';
import type { OrganizationDto, OrganizationSettingsDto } from '../../../../policies/dto';
import { OrganizationSettingsSchema, OrgParamsSchema } from '../../../../policies/schemas';
import { Organization } from '../../entities';
import { authorize } from '../../core/authorize';
import { orgRoute, type RouteDef } from '../../http/route';
import { updateVersioned } from '../../services/versioned';

function toSettingsDto(org: Organization): OrganizationSettingsDto {
  return {
    id: org.id,
    name: org.name,
    emergencyNumber: org.emergencyNumber,
    guardiansSeeClips: org.guardiansSeeClips,
    timeZone: org.timeZone,
    version: org.version,
  };
}

async function loadOrg(m: EntityManager, id: string) {
  return m.findOne(Organization, { where: { id } });
}

export const organizationRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId',
    summary: 'The organization: name and local emergency number',
    access: { kind: 'org', action: 'read', subject: 'Organization' },
    params: OrgParamsSchema,
    async handler({ ds, ability, actor }) {
      const org = await ds.getRepository(Organization).findOneBy({ id: actor.organizationId });
      authorize(ability, 'read', 'Organization', org);
      const dto: OrganizationDto = { id: org.id, name: org.name, emergencyNumber: org.emergencyNumber };
      return dto;
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/settings',
    summary: "The organization's settings, with the version an edit must name (admins)",
    access: { kind: 'org', action: 'update', subject: 'Organization' },
    params: OrgParamsSchema,
    async handler({ ds, ability, actor }) {
      const org = await loadOrg(ds.manager, actor.organizationId);
      authorize(ability, 'update', 'Organization', org);
      return toSettingsDto(org);
    },
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/settings',
    summary: 'Change name, emergency number or whether guardians may watch clips (admins; 409 on a stale version)',
    access: { kind: 'org', action: 'update', subject: 'Organization' },
    params: OrgParamsSchema,
    body: OrganizationSettingsSchema,
    async handler({ ds, ability, actor, body, tx }) {
      const { version, ...changes } = body;
      await tx(async (m, audit) => {
        const org = await loadOrg(m, actor.organizationId);
        authorize(ability, 'update', 'Organization', org);
        await updateVersioned(m, Organization, org.id, version, changes, 'organization settings');
        const before = { name: org.name, emergencyNumber: org.emergencyNumber, guardiansSeeClips: org.guardiansSeeClips };
        await audit({
          action: 'organization.settings_changed',
          subjectType: 'Organization',
          subjectId: org.id,
          before,
          after: { ...before, ...changes },
        });
      });
      return toSettingsDto((await loadOrg(ds.manager, actor.organizationId))!);
    },
  }),
];
