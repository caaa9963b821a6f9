import type { ErrorRequestHandler, Request, RequestHandler, Response } from 'express';
import type { ErrorBody } from '../../../policies/dto';
import type { Deps } from './context';
import type { User } from '../entities';
import { AppError } from '../core/errors';
import { auditRefusal, type Refusal } from '../services/refusals';
import type { ActorWithOrg } from '../services/actor';
import { clientAddress, csrfTrails } from './security';
import { normalise } from './error-mapping';

export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new AppError('not_found', `There is no API route ${req.method} ${req.baseUrl}${req.path}.`));
};

/** The route's pattern ('/api/orgs/:orgId/cases/:id') when a route took the request, so refusals group by route. */
function routeOf(req: Request): string | null {
  const pattern = (req.route as { path?: unknown } | undefined)?.path;
  if (typeof pattern !== 'string') return null;
  // Here, past the /api router, Express has restored baseUrl: every registry route lives below /api.
  const mount = req.baseUrl || (req.originalUrl.startsWith('/api/') && !pattern.startsWith('/api/') ? '/api' : '');
  return `${mount}${pattern}`;
}

/**
 * The refusal to audit, if this error is one (ASVS 5.0 V16.3.2): a 403 for a member, a 404 for a
 * member asking for a record they may not see (distinct from "no such route", which has no actor),
 * and a CSRF refusal. Sign-in limit refusals are audited by the limiter (http/sign-in-limits.ts).
 */
function refusalOf(appErr: AppError, req: Request, res: Response, requestId: string): Refusal | null {
  const actor = res.locals.actor as ActorWithOrg | undefined;
  const path = req.originalUrl.split('?')[0];
  const route = routeOf(req);
  if ((appErr.code === 'forbidden' || appErr.code === 'not_found') && actor && route) {
    return {
      organizationIds: [actor.organizationId],
      actorUserId: actor.userId,
      address: null,
      action: appErr.code === 'forbidden' ? 'access.refused' : 'access.not_found',
      method: req.method,
      route,
      path,
      requestId,
      details: appErr.code === 'forbidden' ? { message: appErr.message } : undefined,
    };
  }
  if (appErr.code === 'csrf_failed') {
    const user = req.user as User | undefined;
    return {
      organizationIds: user ? csrfTrails(user, path) : [null],
      actorUserId: user?.id ?? null,
      address: user ? null : clientAddress(req),
      action: 'access.csrf_refused',
      method: req.method,
      // Refused before routing, for any path: counted per method, so made-up paths cannot add entries.
      route: '(any path)',
      path: path.slice(0, 300),
      requestId,
      details: { message: appErr.message },
    };
  }
  return null;
}
/** The one place errors become responses: `{ error: { code, message, fields? }, requestId }`, never a stack. */
export function errorHandler(deps: Deps): ErrorRequestHandler {
  return (err, req, res, _next) => {
    const appErr = normalise(err);
    const requestId = String(req.id ?? '');
    if (appErr.code === 'internal' || appErr.code === 'unavailable') {
      req.log?.error({ err, requestId }, 'request failed');
    } else {
      req.log?.info({ code: appErr.code, requestId }, appErr.message);
    }
    // Refusals are audited in a transaction of their own: the request itself changed nothing.
    const refusal = refusalOf(appErr, req, res, requestId);
    if (refusal) auditRefusal({ ds: deps.ds, logger: req.log ?? deps.logger }, refusal);
    if (res.headersSent) return;
    const body: ErrorBody = {
      error: {
        code: appErr.code,
        message: appErr.message,
        ...(appErr.fields ? { fields: appErr.fields } : {}),
        ...(appErr.details !== undefined ? { details: appErr.details } : {}),
      },
      requestId,
    };
    res.status(appErr.status).json(body);
  };
}
