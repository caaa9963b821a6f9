import { rateLimit, ipKeyGenerator } from 'express-rate-limit';
import type { RequestHandler } from 'express';
import type { OrganizationSignupStatusDto } from '../../../../policies/dto';
import { NothingSchema, OrganizationSignupConfirmSchema, OrganizationSignupSchema } from '../../../../policies/schemas';
import type { Deps } from '../../http/context';
import { AppError } from '../../core/errors';
import { publicRoute, type RouteDef } from '../../http/route';
import { limitStore, signInLimits } from '../../http/security';
import { confirmOrganizationSignup, requestOrganizationSignup, SIGNUP_REQUESTED } from '../../commands/organization-signup';
import { assertAcceptablePassword } from '../../services/passwords';

export const SIGNUP_CLOSED_MESSAGE =
  'Starting an organization is turned off on this installation. Ask the people who run it to create one for you.';

/** A private installation (ORG_SIGNUP=closed) answers 404 before anything else is read. */
function whenOpen(deps: Deps): RequestHandler {
  return (_req, _res, next) => next(deps.config.ORG_SIGNUP === 'open' ? undefined : new AppError('not_found', SIGNUP_CLOSED_MESSAGE));
}

/**
 * Sign-up requests always answer 202, so they are counted whatever the outcome: per IP address and
 * per e-mail address typed (known or not, so the limit itself reveals nothing), over the sign-in window.
 */
function signupRequestLimits(deps: Deps): RequestHandler[] {
  const common = {
    windowMs: deps.config.SIGNIN_WINDOW_SECONDS * 1000,
    standardHeaders: 'draft-8' as const,
    legacyHeaders: false,
    handler: (_req: unknown, _res: unknown, next: (e: unknown) => void) =>
      next(new AppError('rate_limited', 'Too many requests to start an organization. Wait a few minutes and try again.')),
  };
  return [
    rateLimit({
      ...common,
      store: limitStore(deps, 'org-signup-ip'),
      limit: deps.config.ORG_SIGNUP_MAX_PER_IP,
      keyGenerator: (req) => `ip:${ipKeyGenerator(req.ip ?? 'unknown')}`,
    }),
    rateLimit({
      ...common,
      store: limitStore(deps, 'org-signup-account'),
      limit: deps.config.ORG_SIGNUP_MAX_PER_ACCOUNT,
      keyGenerator: (req) => `signup:${typeof req.body?.email === 'string' ? req.body.email.trim().toLowerCase() : ''}`,
    }),
  ];
}

export function organizationSignupRoutes(deps: Deps): RouteDef[] {
  return [
    publicRoute({
      method: 'get',
      path: '/org-signup',
      summary: 'Whether anyone may start an organization on this installation',
      access: { kind: 'public' },
      params: NothingSchema,
      query: NothingSchema,
      body: NothingSchema,
      async handler(): Promise<OrganizationSignupStatusDto> {
        return { open: deps.config.ORG_SIGNUP === 'open' };
      },
    }),
    publicRoute({
      method: 'post',
      path: '/org-signup',
      summary:
        'Start an organization: e-mails its first admin a confirmation link (the same 202 whether or not the address has an account)',
      access: { kind: 'public' },
      params: NothingSchema,
      query: NothingSchema,
      before: [whenOpen(deps), ...signupRequestLimits(deps)],
      body: OrganizationSignupSchema,
      status: 202,
      command: requestOrganizationSignup,
      async handler({ body, requestId, run }) {
        // The common-password check reveals nothing about the address, so it may answer at once.
        assertAcceptablePassword(body.password);
        // Answered before any lookup, so the time taken says nothing about the address (ASVS 5.0 V6.3.8).
        void run(requestOrganizationSignup, body).catch((err: unknown) =>
          deps.logger.error({ err, requestId }, 'organization sign-up request failed'),
        );
        return SIGNUP_REQUESTED;
      },
    }),
    publicRoute({
      method: 'post',
      path: '/org-signup/confirm',
      summary: 'Confirm the first admin’s e-mail with the link: creates the organization, the account and the admin membership',
      access: { kind: 'public' },
      params: NothingSchema,
      query: NothingSchema,
      // Wrong links count against the per-link sign-in budget, as reset and invitation links do.
      before: [whenOpen(deps), ...signInLimits(deps)],
      body: OrganizationSignupConfirmSchema,
      command: confirmOrganizationSignup,
      async handler({ body, run }) {
        return run(confirmOrganizationSignup, body);
      },
    }),
  ];
}
