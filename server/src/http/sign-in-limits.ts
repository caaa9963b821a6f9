import { createHash } from 'node:crypto';
import type { Request, RequestHandler, Response } from 'express';
import { rateLimit, type Options } from 'express-rate-limit';
import type { Deps } from './context';
import { AppError } from '../core/errors';
import { auditRefusal, organizationsOfEmail } from '../services/refusals';
import { clientAddress, limitStore } from './rate-limit-store';

/**
 * Sign-in limits (ASVS 5.0 V6.3.1), counting failures only: a wrong password or code, or a failed
 * reset or invitation step. A success never counts, so a team signing in from one school network
 * (one shared address) is never locked out by signing in. Three limits over SIGNIN_WINDOW_SECONDS:
 * - per account (SIGNIN_MAX_FAILURES_PER_ACCOUNT), from anywhere;
 * - per account from one address (SIGNIN_MAX_FAILURES_PER_ADDRESS_ACCOUNT, lower): one guesser is
 *   stopped before the account's owner elsewhere is;
 * - per address across accounts (SIGNIN_MAX_PER_IP): a much higher ceiling against password spraying,
 *   which says plainly that it is the network's limit, not the person's.
 * No permanent lockout: when the window passes, the real owner can sign in again. A refusal by a
 * limiter is not itself a failure (no secret was checked), so pressing the button again while
 * refused does not use up the network's budget.
 */

/** A request counts against the limits when a secret (or link) was checked and was wrong. */
const failed = (_req: Request, res: Response) => res.statusCode >= 400 && res.statusCode !== 429;

function minutesUntil(reset: Date | undefined): number {
  return Math.max(1, Math.ceil(((reset?.getTime() ?? Date.now()) - Date.now()) / 60_000));
}
const minutes = (n: number) => (n === 1 ? '1 minute' : `${n} minutes`);

const accountLimited = (wait: number) =>
  new AppError(
    'rate_limited',
    `Too many failed sign-ins for this account. For its protection, sign-in is paused: try again in ${minutes(wait)}, or reset your password.`,
  );
const linkLimited = (wait: number) =>
  new AppError('rate_limited', `Too many failed tries with this link. Try again in ${minutes(wait)}, or ask for a new link.`);
const networkLimited = (wait: number) =>
  new AppError(
    'rate_limited_network',
    `Too many failed sign-ins from this network (everyone here shares one internet address). This is not about your account: wait ${minutes(wait)}, or ask your admin.`,
  );

/** The account a request names, or for invitation and reset links the link itself (hashed). */
function accountKey(req: Request, accountOf?: (req: Request) => string | undefined): { key: string; email: string | null } {
  const named = req.body?.email ?? accountOf?.(req);
  const email = typeof named === 'string' ? named.trim().toLowerCase() : '';
  if (email) return { key: `account:${email}`, email };
  // Invitation and reset routes carry a token, not an e-mail: count failures per link. A single shared
  // key would let ten bad requests from anyone block every invitation for the whole window.
  const token = typeof req.body?.token === 'string' ? req.body.token : '';
  return { key: `link:${createHash('sha256').update(token).digest('hex')}`, email: null };
}

export function signInLimits(
  deps: Deps,
  /** For routes whose body names no account (the second sign-in step): the e-mail to count failures under. */
  opts: { accountOf?: (req: Request) => string | undefined } = {},
): RequestHandler[] {
  const { config } = deps;
  const windowMs = config.SIGNIN_WINDOW_SECONDS * 1000;
  const refuse =
    (limit: 'account' | 'address-account' | 'address'): Options['handler'] =>
    (req, _res, next, options) => {
      const info = (req as unknown as Record<string, { resetTime?: Date } | undefined>)[options.requestPropertyName];
      const wait = minutesUntil(info?.resetTime);
      const { email } = accountKey(req, opts.accountOf);
      // Audited (summarised per address, route and minute) in the trail of each organization the
      // named account belongs to, else in the global trail (ASVS 5.0 V16.3.1).
      const key = ['auth.sign_in_limited', clientAddress(req), email ?? '', req.method, req.path, limit].join('|');
      auditRefusal(
        deps,
        async () => ({
          organizationIds: email ? await organizationsOfEmail(deps.ds, email) : [],
          actorUserId: null,
          address: clientAddress(req),
          action: 'auth.sign_in_limited',
          method: req.method,
          route: `/api${(req.route as { path?: string } | undefined)?.path ?? req.path}`,
          path: req.originalUrl.split('?')[0],
          requestId: String(req.id ?? ''),
          details: { limit, ...(email ? { email } : {}) },
        }),
        key,
      );
      next(limit === 'address' ? networkLimited(wait) : email ? accountLimited(wait) : linkLimited(wait));
    };
  const common = {
    windowMs,
    skipSuccessfulRequests: true,
    requestWasSuccessful: (req: Request, res: Response) => !failed(req, res),
    standardHeaders: 'draft-8' as const,
    legacyHeaders: false,
  };
  const byAddress = rateLimit({
    ...common,
    store: limitStore(deps, 'signin-ip'),
    limit: config.SIGNIN_MAX_PER_IP,
    requestPropertyName: 'signInLimitAddress',
    keyGenerator: (req) => `ip:${clientAddress(req)}`,
    handler: refuse('address'),
  });
  const byAccount = rateLimit({
    ...common,
    store: limitStore(deps, 'signin-account'),
    limit: config.SIGNIN_MAX_FAILURES_PER_ACCOUNT,
    requestPropertyName: 'signInLimitAccount',
    keyGenerator: (req) => accountKey(req, opts.accountOf).key,
    handler: refuse('account'),
  });
  const byAddressAndAccount = rateLimit({
    ...common,
    store: limitStore(deps, 'signin-ip-account'),
    limit: config.SIGNIN_MAX_FAILURES_PER_ADDRESS_ACCOUNT,
    requestPropertyName: 'signInLimitAddressAccount',
    // A link is a secret of its own: its per-link budget above is the limit that matters.
    skip: (req) => accountKey(req, opts.accountOf).email === null,
    keyGenerator: (req) => `ip:${clientAddress(req)}|${accountKey(req, opts.accountOf).key}`,
    handler: refuse('address-account'),
  });
  // The account limits first: a person whose own account is paused hears that, not the network's.
  return [byAccount, byAddressAndAccount, byAddress];
}
