import {
  InvitationAcceptSchema,
  InvitationCreateSchema,
  InvitationTokenSchema,
  NothingSchema,
  OrgItemParamsSchema,
  OrgParamsSchema,
} from '../../../../policies/schemas';
import type { Deps } from '../../http/context';
import { orgRoute, publicRoute, type RouteDef } from '../../http/route';
import { signInLimits } from '../../http/security';
import { sessionDto, sessionWithStep } from '../../http/session-dto';
import { beginSecondStep, startSession } from '../../http/sign-in';
import { acceptInvitation, createInvitation, revokeInvitation } from '../../commands/invitations';
import { invitationPreview, listInvitations } from '../../queries/invitations';

export function invitationRoutes(deps: Deps): RouteDef[] {
  return [
    publicRoute({
      method: 'post',
      path: '/invitations/preview',
      summary: 'What an invitation link is for (the token travels in the body, never the URL)',
      access: { kind: 'public' },
      params: NothingSchema,
      query: NothingSchema,
      writesNothing: 'a POST only so the token travels in the body, never in a URL',
      before: signInLimits(deps),
      body: InvitationTokenSchema,
      async handler({ body }) {
        return invitationPreview(deps, body.token);
      },
    }),
    publicRoute({
      method: 'post',
      path: '/invitations/accept',
      summary: 'Accept an invitation: create or join with an account, then sign in',
      access: { kind: 'public' },
      params: NothingSchema,
      query: NothingSchema,
      before: signInLimits(deps),
      body: InvitationAcceptSchema,
      command: acceptInvitation,
      async handler({ req, body, run }) {
        const { user, secondStep } = await run(acceptInvitation, body);
        // An existing account with two-step sign-in on still needs its code: the password alone
        // (checked by the acceptance) must not sign it in here either.
        if (secondStep) {
          await beginSecondStep(req, user);
          return sessionWithStep(deps, req);
        }
        await startSession(req, user);
        return sessionDto(deps, req);
      },
    }),
    orgRoute({
      method: 'get',
      path: '/orgs/:orgId/invitations',
      summary: 'Invitations of the organization',
      access: { kind: 'org', action: 'read', subject: 'Invitation' },
      params: OrgParamsSchema,
      query: NothingSchema,
      body: NothingSchema,
      async handler({ read }) {
        return read(listInvitations, undefined);
      },
    }),
    orgRoute({
      method: 'post',
      path: '/orgs/:orgId/invitations',
      summary: 'Invite a person by e-mail to one or more roles',
      access: { kind: 'org', action: 'create', subject: 'Invitation' },
      params: OrgParamsSchema,
      query: NothingSchema,
      body: InvitationCreateSchema,
      status: 201,
      command: createInvitation,
      async handler({ body, run }) {
        return run(createInvitation, body);
      },
    }),
    orgRoute({
      method: 'delete',
      path: '/orgs/:orgId/invitations/:id',
      summary: 'Withdraw a pending invitation',
      access: { kind: 'org', action: 'delete', subject: 'Invitation' },
      params: OrgItemParamsSchema,
      query: NothingSchema,
      body: NothingSchema,
      command: revokeInvitation,
      async handler({ params, run }) {
        await run(revokeInvitation, { id: params.id });
        return undefined;
      },
    }),
  ];
}
