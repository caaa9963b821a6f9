import { IsNull } from 'typeorm';
import type { InvitationPreviewDto } from '../../../../policies/dto';
import {
  InvitationAcceptSchema,
  InvitationCreateSchema,
  InvitationTokenSchema,
  OrgItemParamsSchema,
  OrgParamsSchema,
} from '../../../../policies/schemas';
import { Invitation, Organization, User } from '../../entities';
import type { Deps } from '../../http/context';
import { authorize } from '../../core/authorize';
import { orgRoute, publicRoute, type RouteDef } from '../../http/route';
import { signInLimits } from '../../http/security';
import { acceptInvitation, findUsableInvitation, newInvitationToken, toInvitationDto } from '../../services/invitations';
import { sessionDto } from '../../services/session-dto';
import { beginSecondStep, sessionWithStep, startSession } from '../../services/sign-in';
import { isTwoStepOn } from '../../services/two-step';
import { enqueueEmail } from '../../mail/deliveries';
import { emails } from '../../../../templates/email/messages';
import { ROLE_LABELS } from '../../../../policies/roles';

export function invitationRoutes(deps: Deps): RouteDef[] {
  return [
    publicRoute({
      method: 'post',
      path: '/invitations/preview',
      summary: 'What an invitation link is for (the token travels in the body, never the URL)',
      access: { kind: 'public' },
      before: signInLimits(deps),
      body: InvitationTokenSchema,
      async handler({ ds, body }) {
        const inv = await findUsableInvitation(ds.manager, body.token, false);
        const org = await ds.getRepository(Organization).findOneByOrFail({ id: inv.organizationId });
        const hasAccount = await ds.getRepository(User).exists({ where: { email: inv.email } });
        const dto: InvitationPreviewDto = {
          organizationName: org.name,
          email: inv.email,
          roles: inv.roles,
          displayName: inv.displayName,
          hasAccount,
          expiresAt: inv.expiresAt.toISOString(),
        };
        return dto;
      },
    }),
    publicRoute({
      method: 'post',
      path: '/invitations/accept',
      summary: 'Accept an invitation: create or join with an account, then sign in',
      access: { kind: 'public' },
      before: signInLimits(deps),
      body: InvitationAcceptSchema,
      async handler({ ds, req, body, tx }) {
        const user = await tx((m, audit) => acceptInvitation(m, body, deps.config.BCRYPT_COST, audit));
        // An existing account with two-step sign-in on still needs its code: the password alone
        // (checked by the acceptance) must not sign it in here either.
        if (await isTwoStepOn(ds.manager, user.id)) {
          await beginSecondStep(req, user);
          return sessionWithStep(ds, req);
        }
        await startSession(req, user);
        return sessionDto(ds, req);
      },
    }),
    orgRoute({
      method: 'get',
      path: '/orgs/:orgId/invitations',
      summary: 'Invitations of the organization',
      access: { kind: 'org', action: 'read', subject: 'Invitation' },
      params: OrgParamsSchema,
      async handler({ ds, actor }) {
        const rows = await ds.getRepository(Invitation).find({
          where: { organizationId: actor.organizationId },
          relations: { inviter: true },
          order: { createdAt: 'DESC' },
          take: 500,
        });
        return rows.map((inv) => toInvitationDto(inv, inv.inviter?.displayName ?? null));
      },
    }),
    orgRoute({
      method: 'post',
      path: '/orgs/:orgId/invitations',
      summary: 'Invite a person by e-mail to one or more roles',
      access: { kind: 'org', action: 'create', subject: 'Invitation' },
      params: OrgParamsSchema,
      body: InvitationCreateSchema,
      status: 201,
      async handler({ req, user, actor, ability, body, tx }) {
        authorize(ability, 'create', 'Invitation', { id: '', organizationId: actor.organizationId });
        const { token, tokenHash } = newInvitationToken();
        const expiresAt = new Date(Date.now() + deps.config.INVITATION_TTL_HOURS * 3_600_000);
        const base = deps.config.PUBLIC_URL ?? `${req.protocol}://${req.get('host')}`;
        // The token rides in the fragment, which browsers never send to a server or in a Referer.
        const link = `${base}/invite#${token}`;
        const inv = await tx(async (m, audit) => {
          const saved = await m.save(
            m.create(Invitation, {
              organizationId: actor.organizationId,
              email: body.email,
              roles: body.roles,
              displayName: body.displayName ?? null,
              dateOfBirth: body.dateOfBirth ?? null,
              sport: body.sport ?? null,
              tokenHash,
              expiresAt,
              invitedBy: user.id,
            }),
          );
          await audit({
            action: 'invitation.created',
            subjectType: 'Invitation',
            subjectId: saved.id,
            after: { email: saved.email, roles: saved.roles, expiresAt },
          });
          await enqueueEmail(m, deps.jobs, {
            organizationId: actor.organizationId,
            kind: 'invitation',
            to: saved.email,
            content: emails.invitation({
              organizationName: actor.organizationName,
              inviterName: user.displayName,
              roles: saved.roles.map((r) => ROLE_LABELS[r].toLowerCase()).join(' and '),
              link,
              expiresAt: expiresAt.toISOString().slice(0, 10),
            }),
          });
          return saved;
        });
        return toInvitationDto(inv, user.displayName, link);
      },
    }),
    orgRoute({
      method: 'delete',
      path: '/orgs/:orgId/invitations/:id',
      summary: 'Withdraw a pending invitation',
      access: { kind: 'org', action: 'delete', subject: 'Invitation' },
      params: OrgItemParamsSchema,
      async handler({ ability, actor, params, tx }) {
        await tx(async (m, audit) => {
          const inv = await m.findOne(Invitation, { where: { id: params.id, organizationId: actor.organizationId, acceptedAt: IsNull() } });
          authorize(ability, 'delete', 'Invitation', inv);
          if (!inv.revokedAt) {
            inv.revokedAt = new Date();
            await m.save(inv);
            await audit({ action: 'invitation.revoked', subjectType: 'Invitation', subjectId: inv.id });
          }
        });
        return undefined;
      },
    }),
  ];
}
