import { rateLimit, ipKeyGenerator } from 'express-rate-limit';
import type { RequestHandler } from 'express';
import {
  NothingSchema,
  PasswordResetConfirmSchema,
  PasswordResetRequestSchema,
  TwoStepDisableSchema,
  TwoStepEnableSchema,
} from '../../../../policies/schemas';
import type { Deps } from '../../http/context';
import { AppError } from '../../core/errors';
import { publicRoute, type RouteDef } from '../../http/route';
import { limitStore, signInLimits } from '../../http/security';
import { accountLimits } from '../../http/sign-in';
import { requestPasswordReset, resetPassword, RESET_REQUESTED } from '../../commands/password-reset';
import { disableTwoStep, enableTwoStep, replaceRecoveryCodes, startTwoStepSetup } from '../../commands/two-step';
import { twoStepStatus } from '../../queries/account';

/**
 * Reset requests always answer 202, so they are counted whatever the outcome: per IP address and per
 * e-mail address typed (known or not, so the limit itself reveals nothing), over the sign-in window.
 */
function resetRequestLimits(deps: Deps): RequestHandler[] {
  const windowMs = deps.config.SIGNIN_WINDOW_SECONDS * 1000;
  const refused = new AppError('rate_limited', 'Too many password reset requests. Wait a few minutes and try again.');
  const common = {
    windowMs,
    standardHeaders: 'draft-8' as const,
    legacyHeaders: false,
    handler: (_req: unknown, _res: unknown, next: (e: unknown) => void) => next(refused),
  };
  return [
    rateLimit({
      ...common,
      store: limitStore(deps, 'reset-ip'),
      limit: deps.config.RESET_MAX_PER_IP,
      keyGenerator: (req) => `ip:${ipKeyGenerator(req.ip ?? 'unknown')}`,
    }),
    rateLimit({
      ...common,
      store: limitStore(deps, 'reset-account'),
      limit: deps.config.RESET_MAX_PER_ACCOUNT,
      keyGenerator: (req) => `reset:${typeof req.body?.email === 'string' ? req.body.email.trim().toLowerCase() : ''}`,
    }),
  ];
}

export function accountSecurityRoutes(deps: Deps): RouteDef[] {
  const limits = accountLimits(deps);
  return [
    publicRoute({
      method: 'post',
      path: '/password-reset',
      summary: 'Ask for a password reset link by e-mail (the same 202 whether or not the account exists)',
      access: { kind: 'public' },
      params: NothingSchema,
      query: NothingSchema,
      before: resetRequestLimits(deps),
      body: PasswordResetRequestSchema,
      status: 202,
      command: requestPasswordReset,
      async handler({ body, requestId, run }) {
        // Answered before any lookup, so the time taken says nothing about the address (ASVS 5.0 V6.3.8).
        void run(requestPasswordReset, { email: body.email }).catch((err: unknown) =>
          deps.logger.error({ err, requestId }, 'password reset request failed'),
        );
        return RESET_REQUESTED;
      },
    }),
    publicRoute({
      method: 'post',
      path: '/password-reset/confirm',
      summary: 'Choose a new password with a reset link; ends the person’s other sessions',
      access: { kind: 'public' },
      params: NothingSchema,
      query: NothingSchema,
      before: signInLimits(deps),
      body: PasswordResetConfirmSchema,
      command: resetPassword,
      async handler({ req, body, run }) {
        await run(resetPassword, { token: body.token, password: body.password, currentSid: req.sessionID ?? null });
        return undefined;
      },
    }),
    publicRoute({
      method: 'get',
      path: '/account/two-step',
      summary: 'Whether two-step sign-in is on for my account',
      access: { kind: 'signedIn' },
      params: NothingSchema,
      query: NothingSchema,
      body: NothingSchema,
      async handler({ user }) {
        return twoStepStatus(deps, user!.id);
      },
    }),
    publicRoute({
      method: 'post',
      path: '/account/two-step/setup',
      summary: 'Start setting up two-step sign-in: a new authenticator secret, not in force until confirmed',
      access: { kind: 'signedIn' },
      params: NothingSchema,
      query: NothingSchema,
      body: NothingSchema,
      command: startTwoStepSetup,
      async handler({ run }) {
        return run(startTwoStepSetup, undefined);
      },
    }),
    publicRoute({
      method: 'post',
      path: '/account/two-step/enable',
      summary: 'Turn two-step sign-in on with a current code; answers the recovery codes, once',
      access: { kind: 'signedIn' },
      params: NothingSchema,
      query: NothingSchema,
      body: TwoStepEnableSchema,
      command: enableTwoStep,
      async handler({ body, run }) {
        return run(enableTwoStep, body);
      },
    }),
    publicRoute({
      method: 'post',
      path: '/account/two-step/disable',
      summary: 'Turn two-step sign-in off: needs the password and a current code (or a recovery code)',
      access: { kind: 'signedIn' },
      params: NothingSchema,
      query: NothingSchema,
      before: limits,
      body: TwoStepDisableSchema,
      command: disableTwoStep,
      async handler({ body, run }) {
        await run(disableTwoStep, body);
        return undefined;
      },
    }),
    publicRoute({
      method: 'post',
      path: '/account/two-step/recovery-codes',
      summary: 'Replace the recovery codes (password and a current code needed); answers the new ones, once',
      access: { kind: 'signedIn' },
      params: NothingSchema,
      query: NothingSchema,
      before: limits,
      body: TwoStepDisableSchema,
      command: replaceRecoveryCodes,
      async handler({ body, run }) {
        return run(replaceRecoveryCodes, body);
      },
    }),
  ];
}
