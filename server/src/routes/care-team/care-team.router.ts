import { CareTeamAssignmentCreateSchema, OrgItemParamsSchema, OrgParamsSchema } from '../../../../policies/schemas';
import { CareTeamAssignment } from '../../entities';
import { authorize } from '../../core/authorize';
import { AppError } from '../../core/errors';
import { orgRoute, type RouteDef } from '../../http/route';
import { careTeamsFor } from '../../services/people';
import { isUniqueViolation, requireMemberWithRole } from '../../services/org-members';

export const careTeamRoutes: RouteDef[] = [
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/care-team',
    summary: "Put a coach or clinician on an athlete's care team",
    access: { kind: 'org', action: 'create', subject: 'CareTeamAssignment' },
    params: OrgParamsSchema,
    body: CareTeamAssignmentCreateSchema,
    status: 201,
    async handler({ ds, ability, actor, body, tx }) {
      const org = actor.organizationId;
      const id = await tx(async (m, audit) => {
        await requireMemberWithRole(m, org, body.athleteId, 'athlete', 'athleteId');
        await requireMemberWithRole(m, org, body.memberId, body.role, 'memberId');
        authorize(ability, 'create', 'CareTeamAssignment', { id: '', organizationId: org, athleteId: body.athleteId });
        try {
          const saved = await m.save(m.create(CareTeamAssignment, { organizationId: org, ...body }));
          await audit({
            action: 'care_team.assigned',
            subjectType: 'CareTeamAssignment',
            subjectId: saved.id,
            athleteId: body.athleteId,
            after: body,
          });
          return saved.id;
        } catch (err) {
          if (isUniqueViolation(err)) throw new AppError('conflict', `That person is already on this athlete's care team as ${body.role}.`);
          throw err;
        }
      });
      const all = await careTeamsFor(ds, [body.athleteId]);
      return all.find((c) => c.id === id);
    },
  }),
  orgRoute({
    method: 'delete',
    path: '/orgs/:orgId/care-team/:id',
    summary: 'Take a coach or clinician off a care team (their access ends at once)',
    access: { kind: 'org', action: 'delete', subject: 'CareTeamAssignment' },
    params: OrgItemParamsSchema,
    async handler({ ability, actor, params, tx }) {
      await tx(async (m, audit) => {
        const row = await m.findOne(CareTeamAssignment, { where: { id: params.id, organizationId: actor.organizationId } });
        authorize(ability, 'delete', 'CareTeamAssignment', row);
        await m.delete(CareTeamAssignment, { id: row.id });
        await audit({
          action: 'care_team.unassigned',
          subjectType: 'CareTeamAssignment',
          subjectId: row.id,
          athleteId: row.athleteId,
          before: { athleteId: row.athleteId, memberId: row.memberId, role: row.role },
        });
      });
      return undefined;
    },
  }),
];
