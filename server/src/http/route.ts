import type { NextFunction, Request, RequestHandler, Response, Router } from 'express';
import { z } from 'zod';
import { defineAbilityFor, type Action, type SubjectName } from '../../../policies/access';
import { OrgParamsSchema } from '../../../policies/schemas';
import type { User } from '../entities';
import { loadActor } from '../services/actor';
import { AppError, fromZod } from '../core/errors';
import { refusalMessage } from '../core/authorize';
import { loadedActor } from './security';
import { idempotencyKeyOf, runIdempotent } from './idempotency';
import { type AnyCommand, type BaseCtx, type Deps, type OrgCtx } from './context';
import { runOrgCommand, runOrgQuery, runPublicCommand, runPublicQuery } from '../commands/run';

/**
 * Every route says who may call it. There is no default: a route without `access` does not compile.
 * - public: anyone (a short list, reviewed in the route table snapshot);
 * - signedIn: any signed-in person, for their own account;
 * - org: a member of the organization in `:orgId` whose rules allow `action` on some `subject`;
 *   the handler then checks the loaded record itself.
 */
export type Access = { kind: 'public' } | { kind: 'signedIn' } | { kind: 'org'; action: Action; subject: SubjectName };

type Method = 'get' | 'post' | 'patch' | 'put' | 'delete';
type ZodAny = z.ZodType;
type Infer<T extends ZodAny> = z.infer<T>;

interface RouteBase<P, Q, B> {
  method: Method;
  /** Path below /api, Express syntax. */
  path: string;
  summary: string;
  /**
   * Every route declares all three, as strict objects (`NothingSchema` where it takes none): an
   * unknown key in the path, query or body is refused, and the registry refuses a route without
   * them (OWASP ASVS 5.0 V2.2.1).
   */
  params: P;
  query: Q;
  body: B;
  /**
   * The body is a multipart form the handler reads itself (storage/receive.ts), so `body` sees an
   * empty object; any other media type is refused with 415 before validation.
   */
  multipart?: true;
  /** Runs before the session check, e.g. sign-in rate limits. */
  before?: RequestHandler[];
  /**
   * The commands this route may run (server/src/commands). A write route must name at least one:
   * every write goes through a command, and the route table shows which ones change limits.
   */
  command?: AnyCommand | AnyCommand[];
  /**
   * For a POST that writes nothing (a dry-run check, a public lookup): why it needs no command. The
   * registry refuses any other write route without a command.
   */
  writesNothing?: string;
  status?: number;
}

export type RouteDef =
  | (RouteBase<ZodAny, ZodAny, ZodAny> & {
      access: { kind: 'public' } | { kind: 'signedIn' };
      handler: (ctx: BaseCtx<any, any, any>) => Promise<unknown>;
    })
  | (RouteBase<ZodAny, ZodAny, ZodAny> & {
      access: { kind: 'org'; action: Action; subject: SubjectName };
      handler: (ctx: OrgCtx<any, any, any>) => Promise<unknown>;
    });

/** Helpers that keep handler parameter types tied to their schemas. */
export function publicRoute<P extends ZodAny, Q extends ZodAny, B extends ZodAny>(
  def: RouteBase<P, Q, B> & {
    access: { kind: 'public' } | { kind: 'signedIn' };
    handler: (ctx: BaseCtx<Infer<P>, Infer<Q>, Infer<B>>) => Promise<unknown>;
  },
): RouteDef {
  return def as unknown as RouteDef;
}

export function orgRoute<P extends ZodAny, Q extends ZodAny, B extends ZodAny>(
  def: RouteBase<P, Q, B> & {
    access: { kind: 'org'; action: Action; subject: SubjectName };
    handler: (ctx: OrgCtx<Infer<P>, Infer<Q>, Infer<B>>) => Promise<unknown>;
  },
): RouteDef {
  return def as unknown as RouteDef;
}

export interface RouteTableRow {
  method: string;
  path: string;
  access: string;
  /** The commands the route runs, by name; `!` marks one that changes limits (commands/limits.ts). */
  commands: string[];
}

/** Route → required access, for review: the snapshot test makes any change to it visible. */
export const ROUTE_TABLE: RouteTableRow[] = [];

/** Each route's declared input, by `METHOD /api/path`: fuzzers build near-valid requests from it. */
export const ROUTE_INPUTS = new Map<string, { params: ZodAny; query: ZodAny; body: ZodAny }>();

function accessLabel(a: Access): string {
  return a.kind === 'org' ? `member: ${a.action} ${a.subject}` : a.kind;
}

const asyncHandler =
  (fn: (req: Request, res: Response) => Promise<void>): RequestHandler =>
  (req, res, next: NextFunction) => {
    fn(req, res).catch(next);
  };

/** Built once: a zod schema is costly to build, and this one ran on every organization request. */
const OrgIdOnly = OrgParamsSchema.partial().passthrough();

/**
 * A route takes nothing it has not declared: params, query and body are each a strict zod object,
 * and the params name exactly the path's `:parameters` (OWASP ASVS 5.0 V2.2.1).
 */
export function checkDeclaredInput(def: Pick<RouteDef, 'method' | 'path' | 'params' | 'query' | 'body'>): void {
  const where = `${def.method.toUpperCase()} /api${def.path}`;
  for (const part of ['params', 'query', 'body'] as const) {
    const schema: unknown = def[part];
    if (!(schema instanceof z.ZodObject)) {
      throw new Error(`${where}: declare ${part} as a strict zod object (NothingSchema when the route takes none)`);
    }
    if (schema._zod.def.catchall?._zod.def.type !== 'never') {
      throw new Error(`${where}: ${part} must be a strict object (z.strictObject), so unknown keys are refused`);
    }
  }
  const inPath = [...def.path.matchAll(/:(\w+)/g)].map((m) => m[1]).sort();
  const declared = Object.keys((def.params as z.ZodObject).shape).sort();
  if (inPath.join(',') !== declared.join(',')) {
    throw new Error(`${where}: params declares [${declared.join(', ')}] but the path has [${inPath.join(', ')}]`);
  }
}

export function mountRoutes(router: Router, deps: Deps, defs: RouteDef[]): void {
  for (const def of defs) {
    const fullPath = `/api${def.path}`;
    checkDeclaredInput(def);
    const declared = def.command === undefined ? [] : Array.isArray(def.command) ? def.command : [def.command];
    if (def.method !== 'get' && declared.length === 0 && !def.writesNothing) {
      throw new Error(`${def.method.toUpperCase()} ${fullPath}: a write route must declare its command (every write goes through one)`);
    }
    if (def.method === 'get' && declared.length > 0 && declared.some((c) => c.changesLimits)) {
      throw new Error(`GET ${fullPath}: a GET never changes limits`);
    }
    const mayRun = (name: string) => {
      if (!declared.some((c) => c.name === name))
        throw new Error(`${def.method.toUpperCase()} ${fullPath} runs ${name} without declaring it`);
    };
    ROUTE_INPUTS.set(`${def.method.toUpperCase()} ${fullPath}`, { params: def.params, query: def.query, body: def.body });
    if (!ROUTE_TABLE.some((r) => r.method === def.method.toUpperCase() && r.path === fullPath)) {
      ROUTE_TABLE.push({
        method: def.method.toUpperCase(),
        path: fullPath,
        access: accessLabel(def.access),
        commands: declared.map((c) => (c.changesLimits ? `${c.name}!` : c.name)),
      });
    }
    const handler = asyncHandler(async (req, res) => {
      const requestId = String(req.id);
      const user = (req.user as User | undefined) ?? null;
      if (def.access.kind !== 'public' && !user) {
        throw new AppError('unauthenticated', 'Please sign in to continue.');
      }
      // Organization membership is resolved before input validation so an outsider learns nothing
      // about what the route accepts: not a member → 404, as if the organization did not exist.
      let orgCtx: Pick<OrgCtx<unknown, unknown, unknown>, 'actor' | 'ability'> | null = null;
      if (def.access.kind === 'org') {
        const orgParams = OrgIdOnly.safeParse({ orgId: req.params.orgId });
        const orgId = orgParams.success ? orgParams.data.orgId : undefined;
        // Usually loaded with the session row in this request (http/security.ts); else loaded here.
        const loaded = orgId ? loadedActor(user!, orgId) : null;
        const actor = orgId && loaded === undefined ? await loadActor(deps.ds, user!.id, orgId) : loaded;
        if (!actor) throw new AppError('not_found', 'That organization was not found.');
        const ability = defineAbilityFor(actor);
        res.locals.actor = actor;
        if (!ability.can(def.access.action, def.access.subject)) {
          throw new AppError('forbidden', refusalMessage(def.access.action, def.access.subject));
        }
        orgCtx = { actor, ability };
      }
      const parse = (schema: ZodAny, value: unknown, where: 'params' | 'query' | 'body') => {
        const result = schema.safeParse(value ?? {});
        if (!result.success) throw fromZod(result.error, where);
        return result.data;
      };
      if (def.multipart && !req.is('multipart/form-data')) {
        throw new AppError(
          'unsupported_media_type',
          'Send the file as a multipart form (multipart/form-data), the text fields first and the file last.',
        );
      }
      const params = parse(def.params, req.params, 'params');
      const query = parse(def.query, req.query, 'query');
      const body = parse(def.body, req.body, 'body');
      const caller = { deps, requestId, userId: user?.id ?? null };
      const run = orgCtx
        ? (cmd: AnyCommand, input: unknown) => {
            mayRun(cmd.name);
            return runOrgCommand(cmd, { ...caller, userId: user!.id, actor: orgCtx.actor, ability: orgCtx.ability }, input);
          }
        : (cmd: AnyCommand, input: unknown, org: string | null = null) => {
            mayRun(cmd.name);
            return runPublicCommand(cmd, caller, input, org);
          };
      const read = orgCtx
        ? (q: Parameters<typeof runOrgQuery>[0], input: unknown) =>
            runOrgQuery(q, { ...caller, userId: user!.id, actor: orgCtx.actor, ability: orgCtx.ability }, input)
        : undefined;
      const ctx = {
        run,
        read,
        readPublic: (q: Parameters<typeof runPublicQuery>[0], input: unknown) => runPublicQuery(q, deps, input),
        req,
        res,
        deps,
        requestId,
        user,
        params,
        query,
        body,
        ...orgCtx,
      };
      const handle = () => (def.handler as (c: typeof ctx) => Promise<unknown>)(ctx);
      // An organization's write may carry an Idempotency-Key (the offline queue sends one): a replay
      // gets the first answer and writes nothing (http/idempotency.ts). Uploads stream their body, so
      // they have no fingerprint to compare and are left out.
      const key = orgCtx && def.method !== 'get' && !def.multipart ? idempotencyKeyOf(req) : null;
      if (key) {
        const scope = { ds: deps.ds, organizationId: orgCtx!.actor.organizationId, userId: user!.id };
        await runIdempotent(scope, key, req, res, async () => {
          const result = await handle();
          return result === undefined ? { status: def.status ?? 204, body: undefined } : { status: def.status ?? 200, body: result };
        });
        return;
      }
      const result = await handle();
      if (res.headersSent) return;
      if (result === undefined) res.status(def.status ?? 204).end();
      else res.status(def.status ?? 200).json(result);
    });
    router[def.method](def.path, ...(def.before ?? []), handler);
  }
}
