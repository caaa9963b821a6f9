import { AthleteProfileUpdateSchema, OrgItemParamsSchema, OrgParamsSchema } from '../../../../policies/schemas';
import { AthleteProfile } from '../../entities';
import { authorize } from '../../core/authorize';
import { orgRoute, type RouteDef } from '../../http/route';
import { listAthletes } from '../../services/people';
import { updateVersioned } from '../../services/versioned';

export const athleteRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/athletes',
    summary: 'Athletes I may see: admins all, staff their care teams, guardians their own, athletes themselves',
    access: { kind: 'org', action: 'read', subject: 'Athlete' },
    params: OrgParamsSchema,
    async handler({ ds, ability, actor }) {
      return listAthletes(ds, ability, actor.organizationId);
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/athletes/:id',
    summary: "An athlete's profile, care team and guardians",
    access: { kind: 'org', action: 'read', subject: 'Athlete' },
    params: OrgItemParamsSchema,
    async handler({ ds, ability, actor, params }) {
      const [athlete] = await listAthletes(ds, ability, actor.organizationId, params.id);
      authorize(ability, 'read', 'Athlete', athlete);
      return athlete;
    },
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/athletes/:id',
    summary: "Change an athlete's date of birth, sport or position",
    access: { kind: 'org', action: 'update', subject: 'Athlete' },
    params: OrgItemParamsSchema,
    body: AthleteProfileUpdateSchema,
    async handler({ ds, ability, actor, params, body, tx }) {
      const { version, ...changes } = body;
      await tx(async (m, audit) => {
        const profile = await m.findOne(AthleteProfile, { where: { id: params.id, organizationId: actor.organizationId } });
        for (const field of Object.keys(changes)) authorize(ability, 'update', 'Athlete', profile, field);
        authorize(ability, 'update', 'Athlete', profile);
        await updateVersioned(
          m,
          AthleteProfile,
          profile.id,
          version,
          { ...changes, updatedAt: () => 'now()' },
          'athlete profile',
          'membership_id',
        );
        const before = Object.fromEntries(Object.keys(changes).map((k) => [k, profile[k as keyof typeof changes]]));
        await audit({
          action: 'athlete.updated',
          subjectType: 'Athlete',
          subjectId: profile.id,
          athleteId: profile.id,
          before,
          after: changes,
        });
      });
      const [athlete] = await listAthletes(ds, ability, actor.organizationId, params.id);
      return athlete;
    },
  }),
];
