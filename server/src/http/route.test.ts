import { describe, expect, it } from 'vitest';
import express from 'express';
import { z } from 'zod';
import { NothingSchema, OrgItemParamsSchema, OrgParamsSchema } from '../../../policies/schemas';
import { mountRoutes, publicRoute, type RouteDef } from './route';
import type { Deps } from './context';

const handler = async () => ({ ok: true });
/** The registry checks the definitions before it touches deps or the database. */
const deps = {} as Deps;
const mount = (def: unknown) => () => mountRoutes(express.Router(), deps, [def as RouteDef]);

describe('the route registry refuses a route that does not declare its input (ASVS 5.0 V2.2.1)', () => {
  const base = { method: 'get', path: '/fixture-health', summary: 'test', access: { kind: 'public' }, handler } as const;

  it('ASVS 5.0 V2.2.1: accepts a route declaring params, query and body as strict objects', () => {
    expect(mount(publicRoute({ ...base, params: NothingSchema, query: NothingSchema, body: NothingSchema }))).not.toThrow();
  });

  it('ASVS 5.0 V2.2.1: refuses a route without params, query or body, naming what is missing', () => {
    expect(mount({ ...base, query: NothingSchema, body: NothingSchema })).toThrow(/GET \/api\/fixture-health: declare params/);
    expect(mount({ ...base, params: NothingSchema, body: NothingSchema })).toThrow(/declare query/);
    expect(mount({ ...base, params: NothingSchema, query: NothingSchema })).toThrow(/declare body/);
  });

  it('ASVS 5.0 V2.2.1: refuses a schema that lets unknown keys through', () => {
    expect(mount({ ...base, params: NothingSchema, query: z.object({ q: z.string() }), body: NothingSchema })).toThrow(
      /query must be a strict object/,
    );
    expect(mount({ ...base, params: NothingSchema, query: NothingSchema, body: z.object({}).passthrough() })).toThrow(
      /body must be a strict object/,
    );
    expect(mount({ ...base, params: NothingSchema, query: NothingSchema, body: z.string() })).toThrow(
      /declare body as a strict zod object/,
    );
  });

  it("ASVS 5.0 V2.2.1: refuses params that do not name exactly the path's parameters", () => {
    const org = { ...base, path: '/orgs/:orgId/things/:id', query: NothingSchema, body: NothingSchema };
    expect(mount({ ...org, params: OrgParamsSchema })).toThrow(/params declares \[orgId\] but the path has \[id, orgId\]/);
    expect(mount({ ...org, params: NothingSchema })).toThrow(/params declares \[\]/);
    expect(mount({ ...org, params: OrgItemParamsSchema })).not.toThrow();
  });
});
