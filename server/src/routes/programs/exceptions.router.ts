import { z } from 'zod';
import {
  ExceptionCreateSchema,
  ExceptionDecisionSchema,
  NothingSchema,
  OrgParamsSchema,
  ProgramItemParamsSchema,
  UuidSchema,
} from '../../../../policies/schemas';
import { decideException, requestException } from '../../commands/exceptions';
import { orgRoute, type RouteDef } from '../../http/route';
import { listExceptions } from '../../queries/exceptions';

export const exceptionRoutes: RouteDef[] = [
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/sessions/:id/exceptions',
    summary: 'Ask the clinician for an exception on specific sets of a session for one athlete',
    access: { kind: 'org', action: 'create', subject: 'ProgramException' },
    query: NothingSchema,
    command: requestException,
    params: ProgramItemParamsSchema,
    body: ExceptionCreateSchema,
    status: 201,
    async handler({ run, params, body }) {
      return run(requestException, { ...body, sessionId: params.id });
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/exceptions',
    summary: 'Exception requests of my athletes',
    access: { kind: 'org', action: 'read', subject: 'ProgramException' },
    params: OrgParamsSchema,
    body: NothingSchema,
    query: z.strictObject({
      athleteId: UuidSchema.optional(),
      state: z.enum(['pending', 'all'], { message: 'must be pending or all' }).default('all'),
    }),
    async handler({ read, query }) {
      return read(listExceptions, query);
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/exceptions/:id/decide',
    summary: 'Grant (optionally for fewer sets) or refuse an exception, with a note — clinicians on the care team only',
    access: { kind: 'org', action: 'update', subject: 'ProgramException' },
    query: NothingSchema,
    command: decideException,
    params: ProgramItemParamsSchema,
    body: ExceptionDecisionSchema,
    async handler({ run, params, body }) {
      return run(decideException, { ...body, id: params.id });
    },
  }),
];
