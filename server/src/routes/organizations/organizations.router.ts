import { NothingSchema, OrganizationSettingsSchema, OrgParamsSchema } from '../../../../policies/schemas';
import { orgRoute, type RouteDef } from '../../http/route';
import { updateOrganizationSettings } from '../../commands/organizations';
import { getOrganization, getOrganizationSettings } from '../../queries/organizations';

export const organizationRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId',
    summary: 'The organization: name, local emergency number and time zone',
    access: { kind: 'org', action: 'read', subject: 'Organization' },
    params: OrgParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    async handler({ read }) {
      return read(getOrganization, undefined);
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/settings',
    summary: "The organization's settings, with the version an edit must name (admins)",
    access: { kind: 'org', action: 'update', subject: 'Organization' },
    params: OrgParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    async handler({ read }) {
      return read(getOrganizationSettings, undefined);
    },
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/settings',
    summary:
      'Change name, country, emergency number, time zone, letter paper or whether guardians may watch clips (admins; 409 on a stale version)',
    access: { kind: 'org', action: 'update', subject: 'Organization' },
    params: OrgParamsSchema,
    query: NothingSchema,
    body: OrganizationSettingsSchema,
    command: updateOrganizationSettings,
    async handler({ body, run }) {
      return run(updateOrganizationSettings, body);
    },
  }),
];
