import { AthleteProfileUpdateSchema, NothingSchema, OrgItemParamsSchema, OrgParamsSchema } from '../../../../policies/schemas';
import { orgRoute, type RouteDef } from '../../http/route';
import { updateAthleteProfile } from '../../commands/people';
import { getAthlete, listAthletes } from '../../queries/athletes';

export const athleteRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/athletes',
    summary: 'Athletes I may see: admins all, staff their care teams, guardians their own, athletes themselves',
    access: { kind: 'org', action: 'read', subject: 'Athlete' },
    params: OrgParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    async handler({ read }) {
      return read(listAthletes, undefined);
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/athletes/:id',
    summary: "An athlete's profile, care team and guardians",
    access: { kind: 'org', action: 'read', subject: 'Athlete' },
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    async handler({ read, params }) {
      return read(getAthlete, { id: params.id });
    },
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/athletes/:id',
    summary: "Change an athlete's date of birth, sport or position",
    access: { kind: 'org', action: 'update', subject: 'Athlete' },
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: AthleteProfileUpdateSchema,
    command: updateAthleteProfile,
    async handler({ params, body, run }) {
      return run(updateAthleteProfile, { ...body, id: params.id });
    },
  }),
];
