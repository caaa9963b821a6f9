import { MembershipUpdateSchema, OrgItemParamsSchema, OrgParamsSchema } from '../../../../policies/schemas';
import { AthleteProfile, Membership } from '../../entities';
import { authorize } from '../../core/authorize';
import { AppError } from '../../core/errors';
import { orgRoute, type RouteDef } from '../../http/route';
import { listPeople } from '../../services/people';
import { endSessionsOf, updateVersioned } from '../../services/versioned';

export const peopleRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/people',
    summary: 'People of the organization and their roles',
    access: { kind: 'org', action: 'read', subject: 'Membership' },
    params: OrgParamsSchema,
    async handler({ ds, ability, actor }) {
      return listPeople(ds, ability, actor.organizationId);
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/people/:id',
    summary: 'One person',
    access: { kind: 'org', action: 'read', subject: 'Membership' },
    params: OrgItemParamsSchema,
    async handler({ ds, ability, actor, params }) {
      const [person] = await listPeople(ds, ability, actor.organizationId, params.id);
      authorize(ability, 'read', 'Membership', person);
      return person;
    },
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/people/:id',
    summary: "Change a person's roles",
    access: { kind: 'org', action: 'update', subject: 'Membership' },
    params: OrgItemParamsSchema,
    body: MembershipUpdateSchema,
    async handler({ ds, req, ability, actor, params, body, tx }) {
      await tx(async (m, audit) => {
        const membership = await m.findOne(Membership, { where: { id: params.id, organizationId: actor.organizationId, active: true } });
        authorize(ability, 'update', 'Membership', membership, 'roles');
        if (membership.id === actor.membershipId && !body.roles.includes('admin')) {
          throw new AppError(
            'conflict',
            'You cannot remove your own admin role. Ask another admin to do it, so the organization always has one.',
          );
        }
        await updateVersioned(m, Membership, membership.id, body.version, { roles: body.roles, updatedAt: () => 'now()' }, 'person');
        if (body.roles.includes('athlete')) {
          const profile = await m.findOne(AthleteProfile, { where: { id: membership.id } });
          if (!profile)
            await m.save(
              m.create(AthleteProfile, {
                id: membership.id,
                organizationId: actor.organizationId,
                dateOfBirth: null,
                sport: null,
                position: null,
              }),
            );
        }
        // A role change ends the person's other sessions: they sign in again under a new session id.
        await endSessionsOf(m, membership.userId, req.sessionID);
        await audit({
          action: 'membership.roles_changed',
          subjectType: 'Membership',
          subjectId: membership.id,
          before: { roles: membership.roles },
          after: { roles: body.roles },
        });
      });
      const [person] = await listPeople(ds, ability, actor.organizationId, params.id);
      return person;
    },
  }),
  orgRoute({
    method: 'delete',
    path: '/orgs/:orgId/people/:id',
    summary: 'Remove a person from the organization (their records stay)',
    access: { kind: 'org', action: 'delete', subject: 'Membership' },
    params: OrgItemParamsSchema,
    async handler({ ability, actor, params, tx }) {
      await tx(async (m, audit) => {
        const membership = await m.findOne(Membership, { where: { id: params.id, organizationId: actor.organizationId, active: true } });
        authorize(ability, 'delete', 'Membership', membership);
        if (membership.id === actor.membershipId) {
          throw new AppError('conflict', 'You cannot remove yourself. Ask another admin to do it.');
        }
        await m.update(Membership, { id: membership.id }, { active: false });
        await endSessionsOf(m, membership.userId);
        await audit({
          action: 'membership.removed',
          subjectType: 'Membership',
          subjectId: membership.id,
          before: { roles: membership.roles, active: true },
          after: { active: false },
        });
      });
      return undefined;
    },
  }),
];
