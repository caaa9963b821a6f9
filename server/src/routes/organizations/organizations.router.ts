import type { OrganizationDto } from '../../../../policies/dto';
import { OrgParamsSchema } from '../../../../policies/schemas';
import { Organization } from '../../entities';
import { authorize } from '../../http/authorize';
import { orgRoute, type RouteDef } from '../../http/route';

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
];
