import type { ErrorRequestHandler, RequestHandler } from 'express';
import type { ErrorBody } from '../../../policies/dto';
import type { Deps } from './context';
import { AppError } from '../core/errors';
import { appendAudit } from '../services/audit';
import type { ActorWithOrg } from '../services/actor';
import { normalise } from './error-mapping';

export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new AppError('not_found', `There is no API route ${req.method} ${req.baseUrl}${req.path}.`));
};

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
    const actor = res.locals.actor as ActorWithOrg | undefined;
    if (appErr.code === 'forbidden' && actor) {
      // Refusals are audited in a transaction of their own: the request itself changed nothing.
      deps.ds
        .transaction((m) =>
          appendAudit(m, {
            organizationId: actor.organizationId,
            actorUserId: actor.userId,
            requestId,
            action: 'access.refused',
            subjectType: 'Route',
            after: { method: req.method, path: req.originalUrl.split('?')[0], message: appErr.message },
          }),
        )
        .catch((auditErr) => deps.logger.error({ err: auditErr, requestId }, 'could not audit a refusal'));
    }
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
