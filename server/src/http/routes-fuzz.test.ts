import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { z } from 'zod';
import * as schemas from '../../../policies/schemas';
import { Client, signedIn, useHarness } from '../test/harness';
import { expectNoStack } from '../test/no-stack';
import { createOrg, TEST_PASSWORD, type TestOrg } from '../test/factories';
import { ROUTE_TABLE } from './route';

/**
 * Property: no body, path or query string makes any route answer 5xx or show a stack, for any role
 * (ASVS 5.0 V16.5.1: errors are handled without leaking internals). bench/fuzz.ts runs the same idea
 * 10,000 times against a running server; this is the quick version every test run makes.
 */

/** Values at the edges of what the columns and parsers hold: int4, dates, NUL, long text, surrogates. */
const EDGE_VALUES: unknown[] = [
  2 ** 31,
  2 ** 31 - 1,
  -(2 ** 31) - 1,
  -1,
  0,
  1e308,
  '\u0000',
  'a\u0000b',
  '0000-01-01',
  '9999-12-31',
  '2999-02-30',
  'x'.repeat(10_240),
  '\uD800',
  'a\uDC00b',
  '',
  null,
  [],
  {},
  { $gt: '' },
  'a\r\nBcc: x@test.example',
];

/** Path segments at the edges: malformed escapes (RFC 3986 section 2.1), an encoded NUL and lone surrogate, int4 overflow. */
const EDGE_SEGMENTS = [
  '%ZZ',
  '%',
  '%E0%A4%A',
  '%ED%A0%80',
  '%00',
  '%C0%AF',
  '2147483648',
  '-1',
  '..',
  'x'.repeat(2000),
  randomUUID().toUpperCase(),
];
const EDGE_QUERY = ['%ZZ', 'a%', '%00', '%ED%A0%80', 'x[y]=1', '__proto__[admin]=1', 'a=1&a=2', '=', 'limit=1e3', 'date=0000-01-01'];

/** Every field name any request schema knows, so generated input often looks almost right. */
const knownKeys = [
  ...new Set(Object.values(schemas).flatMap((s) => (s instanceof z.ZodObject ? Object.keys((s as z.ZodObject).shape) : []))),
];

const WRITE_METHODS = ['POST', 'PATCH', 'PUT', 'DELETE'];

/** encodeURIComponent throws on an unpaired surrogate; send its would-be UTF-8 bytes instead (a case of its own). */
const LONE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g;
const encode = (s: string) => encodeURIComponent(s.replace(LONE, '\uFFFD')).replace(/%EF%BF%BD/g, '%ED%A0%80');

function fillPath(path: string, ids: Record<string, string>, segment?: (name: string) => string | undefined): string {
  return path.replace(/:(\w+)/g, (_m, name: string) => segment?.(name) ?? ids[name] ?? randomUUID());
}

type Role = 'admin' | 'coach' | 'clinician' | 'athlete' | 'guardian';
const ROLES: Role[] = ['admin', 'coach', 'clinician', 'athlete', 'guardian'];

describe('property: no input makes a route answer 5xx or show a stack, for any role', () => {
  const h = useHarness({ SIGNIN_MAX_PER_IP: '10000', SIGNIN_MAX_FAILURES_PER_ACCOUNT: '10000' });
  let org: TestOrg;
  const callers = new Map<Role | 'signed out', Client>();

  const call = (caller: Client, method: string, path: string, json?: string) => {
    const req = caller.agent[method.toLowerCase() as 'get' | 'post' | 'patch' | 'put' | 'delete'](path);
    return WRITE_METHODS.includes(method)
      ? req
          .set('x-csrf-token', caller.csrf)
          .set('Content-Type', 'application/json')
          .send(json ?? '{}')
      : req;
  };
  const judge = (what: string, res: { status: number; text: string; body?: { error?: { code?: unknown } } }) => {
    if (res.status >= 500) throw new Error(`${what} → ${res.status} ${res.text}`);
    // 431 (RFC 6585 section 5) comes from Node's HTTP parser for a request line over 16 kB, before the app.
    if (res.status >= 400 && res.status !== 431) expect(res.body?.error?.code, `${what} → ${res.text}`).toEqual(expect.any(String));
    expectNoStack(res.text);
  };

  it('signs in every role', async () => {
    org = await createOrg(h.ds);
    for (const role of ROLES) callers.set(role, await signedIn(h.app, org[role].email, TEST_PASSWORD));
    callers.set('signed out', await Client.anonymous(h.app));
    expect(knownKeys).toEqual(expect.arrayContaining(['email', 'password', 'token', 'roles', 'version', 'athleteId']));
  });

  const realIds = () => [org.id, org.athlete.membershipId, org.coach.membershipId, org.clinician.membershipId, org.guardian.membershipId];
  const value = () =>
    fc.oneof(fc.constantFrom(...EDGE_VALUES, ...realIds(), '2026-05-05', 'coach', ['athlete'], 1, 2), fc.jsonValue({ maxDepth: 2 }));

  // 25 bodies per write route; the time grows with the route table, hence its own timeout.
  it('ASVS 5.0 V16.5.1: arbitrary bodies, sent by a member each write route admits', { timeout: 180_000 }, async () => {
    const bodyArb = fc.oneof(
      fc.anything({ maxDepth: 2 }),
      fc.dictionary(fc.constantFrom(...knownKeys), value(), { maxKeys: 6 }),
      fc.dictionary(fc.constantFrom(...knownKeys, '__proto__', 'constructor', 'organizationId'), value(), { maxKeys: 4 }),
    );
    // `:id` is a real athlete (valid for people and athletes), so well-formed bodies reach the handlers.
    const ids = { orgId: org.id, id: org.athlete.membershipId };
    const routes = ROUTE_TABLE.filter((r) => ['POST', 'PATCH', 'PUT'].includes(r.method));
    expect(routes.length).toBeGreaterThanOrEqual(5);
    const codes: Record<string, Set<string>> = {};
    for (const route of routes) {
      const path = fillPath(route.path, ids);
      // The first role the route admits (403 comes before validation), so the bodies reach the schemas.
      let caller = callers.get('admin')!;
      for (const role of ROLES) {
        caller = callers.get(role)!;
        if ((await call(caller, route.method, path)).body?.error?.code !== 'forbidden') break;
      }
      const seen = (codes[`${route.method} ${route.path}`] = new Set());
      await fc.assert(
        fc.asyncProperty(bodyArb, async (body) => {
          const json = JSON.stringify(body) ?? '';
          const res = await call(caller, route.method, path, json);
          seen.add(res.status < 400 ? String(res.status) : res.body?.error?.code);
          judge(`${route.method} ${path} with ${json.slice(0, 200)}`, res);
        }),
        { numRuns: 25 },
      );
    }
    // Every caller stayed signed in and passed CSRF, so the bodies were judged on their content.
    for (const [route, seen] of Object.entries(codes)) {
      expect(
        [...seen].filter((c) => c === 'unauthenticated' || c === 'csrf_failed'),
        route,
      ).toEqual([]);
    }
  });

  it(
    'RFC 3986 section 2.1, ASVS 5.0 V16.5.1: arbitrary path parameters on every route, for every role and signed out',
    { timeout: 180_000 },
    async () => {
      const segmentArb = fc.oneof(fc.constantFrom(...EDGE_SEGMENTS), fc.string({ unit: 'binary', maxLength: 12 }).map(encode));
      const ids = { orgId: org.id, id: org.athlete.membershipId };
      for (const route of ROUTE_TABLE.filter((r) => r.path.includes(':'))) {
        const names = [...route.path.matchAll(/:(\w+)/g)].map((m) => m[1]);
        for (const [role, caller] of callers) {
          await fc.assert(
            fc.asyncProperty(segmentArb, fc.nat(names.length), async (segment, which) => {
              // One parameter at the edge, the others real; or all real and a trailing segment at the edge.
              const path =
                which === names.length
                  ? `${fillPath(route.path, ids)}/${segment}`
                  : fillPath(route.path, ids, (name) => (name === names[which] ? segment : undefined));
              judge(`${route.method} ${path} as ${role}`, await call(caller, route.method, path));
            }),
            { numRuns: 3 },
          );
        }
      }
    },
  );

  it('ASVS 5.0 V2.2.1, V16.5.1: arbitrary query strings on every route, for every role and signed out', { timeout: 180_000 }, async () => {
    const pairArb = fc.oneof(
      fc.constantFrom(...EDGE_QUERY),
      fc
        .tuple(fc.constantFrom(...knownKeys, 'state', 'days', 'limit', 'before', 'from', 'to', 'date'), value())
        .map(([k, v]) => `${encode(k)}=${encode(typeof v === 'string' ? v : (JSON.stringify(v) ?? ''))}`),
    );
    const queryArb = fc.array(pairArb, { minLength: 1, maxLength: 4 }).map((parts) => parts.join('&'));
    const ids = { orgId: org.id, id: org.athlete.membershipId };
    for (const route of ROUTE_TABLE) {
      for (const [role, caller] of callers) {
        await fc.assert(
          fc.asyncProperty(queryArb, async (query) => {
            const path = `${fillPath(route.path, ids)}?${query}`;
            judge(`${route.method} ${path} as ${role}`, await call(caller, route.method, path));
          }),
          { numRuns: 3 },
        );
      }
    }
  });
});
