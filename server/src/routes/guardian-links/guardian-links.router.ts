import { GuardianLinkCreateSchema, OrgItemParamsSchema, OrgParamsSchema } from '../../../../policies/schemas';
import { GuardianLink } from '../../entities';
import { authorize } from '../../core/authorize';
import { AppError } from '../../core/errors';
import { orgRoute, type RouteDef } from '../../http/route';
import { guardianLinksFor } from '../../services/people';
import { isUniqueViolation, requireMemberWithRole } from '../../services/org-members';

export const guardianLinkRoutes: RouteDef[] = [
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/guardian-links',
    summary: 'Link a guardian to an athlete',
    access: { kind: 'org', action: 'create', subject: 'GuardianLink' },
    params: OrgParamsSchema,
    body: GuardianLinkCreateSchema,
    status: 201,
    async handler({ ds, ability, actor, body, tx }) {
      const org = actor.organizationId;
      const id = await tx(async (m, audit) => {
        await requireMemberWithRole(m, org, body.athleteId, 'athlete', 'athleteId');
        await requireMemberWithRole(m, org, body.guardianId, 'guardian', 'guardianId');
        authorize(ability, 'create', 'GuardianLink', { id: '', organizationId: org, ...body });
        try {
          const saved = await m.save(m.create(GuardianLink, { organizationId: org, ...body }));
          await audit({
            action: 'guardian.linked',
            subjectType: 'GuardianLink',
            subjectId: saved.id,
            athleteId: body.athleteId,
            after: body,
          });
          return saved.id;
        } catch (err) {
          if (isUniqueViolation(err)) throw new AppError('conflict', 'That guardian is already linked to this athlete.');
          throw err;
        }
      });
      const links = await guardianLinksFor(ds, { athleteIds: [body.athleteId] });
      return links.find((l) => l.id === id);
    },
  }),
  orgRoute({
    method: 'delete',
    path: '/orgs/:orgId/guardian-links/:id',
    summary: 'Unlink a guardian from an athlete',
    access: { kind: 'org', action: 'delete', subject: 'GuardianLink' },
    params: OrgItemParamsSchema,
    async handler({ ability, actor, params, tx }) {
      await tx(async (m, audit) => {
        const row = await m.findOne(GuardianLink, { where: { id: params.id, organizationId: actor.organizationId } });
        authorize(ability, 'delete', 'GuardianLink', row);
        await m.delete(GuardianLink, { id: row.id });
        await audit({
          action: 'guardian.unlinked',
          subjectType: 'GuardianLink',
          subjectId: row.id,
          athleteId: row.athleteId,
          before: { athleteId: row.athleteId, guardianId: row.guardianId },
        });
      });
      return undefined;
    },
  }),
];
