/**
 * `npm run fuzz`: 10,000 requests (FUZZ_REQUESTS) against a real running server with the demo
 * organization, over every route, as every role (admin, coach, clinician, athlete, guardian, signed
 * out), fuzzing bodies, paths and query strings with values at the edges (2^31, -1, NUL, year 0,
 * 10 kB strings, unpaired surrogates, malformed percent-escapes). It fails (exit 1) on any 5xx or
 * any answer that shows a stack; it prints the figures the README reports. FUZZ_SEED replays a run,
 * FUZZ_LOG=error shows the server's log of a failure, FUZZ_TRACE=<file> writes every request and answer.
 */
import { randomUUID } from 'node:crypto';
import { appendFileSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { z } from 'zod';
import * as schemas from '../policies/schemas';
import { loadConfig } from '../server/src/config';
import { createDataSource } from '../server/src/data-source';
import { ROUTE_INPUTS, ROUTE_TABLE } from '../server/src/http/route';
import { createLogger } from '../server/src/logger';
import { DEMO_PASSWORD, DEMO_PEOPLE, loadDemo } from '../server/src/seed/demo';
import { startServer } from '../server/src/server';
import { createStorage } from '../server/src/storage';
import { migrate, openDatabase } from '../scripts/runtime';
import { leafPaths, replaceAt, sampleOf, type ValueSource } from './fuzz-values';

const TOTAL = Number(process.env.FUZZ_REQUESTS ?? 10_000);
const SEED = Number(process.env.FUZZ_SEED ?? Date.now() % 2 ** 31);
const CONCURRENCY = 8;
/** FUZZ_TRACE=<file>: every request and its answer, one line each. */
const trace = process.env.FUZZ_TRACE;
const ROLES = ['admin', 'coach', 'clinician', 'athlete', 'guardian'] as const;
type Caller = (typeof ROLES)[number] | 'signed out';
type Mode = 'body' | 'path' | 'query';

/** mulberry32: small, seeded, good enough to choose routes and values reproducibly. */
function prng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
const rand = prng(SEED);
const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rand() * xs.length)];

/** Values at the edges of what the columns and the parsers hold. */
const EDGE_VALUES: unknown[] = [
  2 ** 31,
  2 ** 31 - 1,
  -(2 ** 31) - 1,
  2 ** 53,
  -1,
  0,
  1,
  0.5,
  1e308,
  -1e308,
  '\u0000',
  'a\u0000b',
  '0000-01-01',
  '9999-12-31',
  '1899-12-31',
  '2024-02-30',
  '+010000-01-01',
  '2026-06-01',
  'x'.repeat(10_240),
  '\uD800',
  'a\uDC00b',
  '💪',
  '',
  ' ',
  true,
  false,
  null,
  [],
  {},
  [null],
  { $gt: '' },
  "' OR 1=1 --",
  'a\r\nBcc: x@test.example',
  '../../etc/passwd',
  '00000000-0000-0000-0000-000000000000',
  'kg',
  'lb',
  'coach',
  ['athlete', 'admin'],
  'limited',
  'capped',
  'grant',
  'America/Chicago',
];

/** Path segments that stress the router's decoding and the params schemas. */
const EDGE_SEGMENTS = [
  '%ZZ',
  '%',
  '%E0%A4%A',
  '%ED%A0%80',
  '%00',
  '%C0%AF',
  '2147483648',
  '-1',
  '0',
  '..',
  'x'.repeat(2000),
  '%F0%9F%92%AA',
  encodeURIComponent('\u0000'),
  '00000000-0000-0000-0000-000000000000',
  randomUUID().toUpperCase(),
  `{${randomUUID()}}`,
];

/** Raw query-string pieces: malformed escapes, nesting, repeats, prototype names. */
const EDGE_QUERY = ['%ZZ', 'a%', '%00', '%ED%A0%80', 'x[y]=1', '__proto__[admin]=1', 'constructor=1', 'a=1&a=2', '=', '&&', 'limit=1e3'];

const knownKeys = [
  ...new Set(Object.values(schemas).flatMap((s) => (s instanceof z.ZodObject ? Object.keys((s as z.ZodObject).shape) : []))),
  ...['state', 'days', 'limit', 'before', 'from', 'to', 'date', 'action', 'actorId', 'subjectId', 'trainingLogId'],
];

/** The path segment before `:id` → the table whose ids fit it. */
const TABLE_FOR: Record<string, string> = {
  cases: 'cases',
  plans: 'restriction_plans',
  athletes: 'memberships',
  people: 'memberships',
  sessions: 'program_sessions',
  programs: 'programs',
  letters: 'clearance_letters',
  flags: 'flags',
  notifications: 'notifications',
  clips: 'clips',
  notes: 'clip_notes',
  documents: 'case_documents',
  exceptions: 'program_exceptions',
  invitations: 'invitations',
  'care-team': 'care_team_assignments',
  'guardian-links': 'guardian_links',
  exercises: 'exercises',
  'training-logs': 'training_logs',
};

interface Session {
  cookie: string;
  csrf: string;
}

async function openSession(base: string, email?: string): Promise<Session> {
  const s = await fetch(`${base}/api/session`);
  let cookie = (s.headers.get('set-cookie') ?? '').split(';')[0];
  let { csrfToken: csrf } = (await s.json()) as { csrfToken: string };
  if (email) {
    const res = await fetch(`${base}/api/session`, {
      method: 'POST',
      headers: { cookie, 'content-type': 'application/json', 'x-csrf-token': csrf },
      body: JSON.stringify({ email, password: DEMO_PASSWORD }),
    });
    if (res.status !== 200) throw new Error(`sign-in failed for ${email}: ${res.status}`);
    cookie = (res.headers.get('set-cookie') ?? cookie).split(';')[0];
    csrf = ((await res.json()) as { csrfToken: string }).csrfToken;
  }
  return { cookie, csrf };
}

/** encodeURIComponent throws on an unpaired surrogate: send its would-be UTF-8 bytes (%ED%A0%80), a case of its own. */
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g;
const encode = (s: string) => encodeURIComponent(s.replace(LONE_SURROGATE, '\uFFFD')).replace(/%EF%BF%BD/g, '%ED%A0%80');

const STACK = [/"stack"/, /^\s*at\s/m, /\bat\s+\S+\s+\(.*:\d+:\d+\)/, /node_modules|\/server\/src\//];

async function main() {
  const db = await openDatabase('loadline_fuzz', true);
  const storageDir = mkdtempSync(join(tmpdir(), 'loadline-fuzz-'));
  try {
    await migrate(db.url);
    const env = {
      DATABASE_URL: db.url,
      SESSION_SECRET: 'fuzz-secret-fuzz-secret-fuzz-secret-fuzz-42',
      PORT: '0',
      LOG_LEVEL: process.env.FUZZ_LOG ?? 'silent',
      STORAGE_DIR: storageDir,
      SIGNIN_MAX_PER_IP: '100000',
      SIGNIN_MAX_FAILURES_PER_ACCOUNT: '100000',
    };
    const config = loadConfig(env);
    const seedDs = createDataSource(db.url, 2);
    await seedDs.initialize();
    const { organizationId: orgId } = await loadDemo(seedDs, { config, bcryptCost: 4, storage: createStorage(config) });

    // Real ids, so well-formed requests reach the handlers and the database.
    const idsOf: Record<string, string[]> = {};
    for (const table of new Set(Object.values(TABLE_FOR))) {
      const rows: { id: string }[] = await seedDs.query(`SELECT id::text AS id FROM ${table} WHERE organization_id = $1 LIMIT 30`, [orgId]);
      idsOf[table] = rows.map((r) => r.id);
    }
    const athletes: { id: string }[] = await seedDs.query(
      `SELECT id::text AS id FROM memberships WHERE organization_id = $1 AND 'athlete' = ANY(roles)`,
      [orgId],
    );
    await seedDs.destroy();
    const allIds = Object.values(idsOf).flat();

    const app = await startServer(config, createLogger(env.LOG_LEVEL));
    const base = app.url;
    const emails = Object.fromEntries(ROLES.map((r) => [r, DEMO_PEOPLE.find((p) => p.roles.includes(r))!.email]));
    const sessions = new Map<Caller, Session>();
    for (const r of ROLES) sessions.set(r, await openSession(base, emails[r]));
    sessions.set('signed out', await openSession(base));

    const anything = fc.sample(fc.anything({ maxDepth: 2 }), { numRuns: 2000, seed: SEED });
    const value = (): unknown => {
      const r = rand();
      if (r < 0.45) return pick(EDGE_VALUES);
      if (r < 0.65) return pick(allIds);
      return pick(anything);
    };
    const athleteIds = athletes.map((a) => a.id);
    const src: ValueSource = { rand, id: () => (rand() < 0.5 ? pick(athleteIds) : pick(allIds)) };
    /** Mostly a body the route's schema accepts with one leaf swapped for an edge value; else noise. */
    const bodyOf = (schema?: z.ZodType): string => {
      if (schema && rand() < 0.7) {
        const valid = sampleOf(schema, src);
        if (rand() < 0.15) return JSON.stringify(valid) ?? '{}';
        return JSON.stringify(replaceAt(valid, pick(leafPaths(valid)), value())) ?? '{}';
      }
      const r = rand();
      if (r < 0.05) return pick(['{"a":', 'null', '[]', '"text"', '{"__proto__":{"admin":true}}', '\u0000']);
      if (r < 0.15) return JSON.stringify(pick(anything)) ?? '{}';
      const body: Record<string, unknown> = {};
      const n = Math.floor(rand() * 8);
      for (let i = 0; i < n; i++) body[pick(knownKeys)] = value();
      return JSON.stringify(body);
    };
    const idFor = (path: string, name: string): string => {
      if (name === 'orgId') return orgId;
      if (name === 'version') return String(pick([1, 2, 3]));
      const before = path.split(`/:${name}`)[0].split('/').pop() ?? '';
      const fitting = idsOf[TABLE_FOR[name === 'noteId' ? 'notes' : before]] ?? [];
      return rand() < 0.8 && fitting.length ? pick(fitting) : pick(allIds);
    };
    const queryOf = (schema?: z.ZodType): string => {
      if (schema && rand() < 0.5) {
        const valid = sampleOf(schema, src) as Record<string, unknown>;
        const keys = Object.keys(valid);
        const bad = keys.length && rand() < 0.8 ? pick(keys) : pick(knownKeys);
        valid[bad] = value();
        return Object.entries(valid)
          .map(([k, v]) => `${encode(k)}=${encode(typeof v === 'string' ? v : (JSON.stringify(v) ?? ''))}`)
          .join('&');
      }
      const parts: string[] = [];
      const n = 1 + Math.floor(rand() * 4);
      for (let i = 0; i < n; i++) {
        if (rand() < 0.2) parts.push(pick(EDGE_QUERY));
        else {
          const v = value();
          const text = typeof v === 'string' ? v : JSON.stringify(v);
          parts.push(`${encode(pick(knownKeys))}=${rand() < 0.15 ? pick(EDGE_SEGMENTS) : encode(text ?? '')}`);
        }
      }
      return parts.join('&');
    };

    const statuses: Record<string, number> = {};
    const byMode: Record<Mode, number> = { body: 0, path: 0, query: 0 };
    const byCaller: Record<string, number> = {};
    const failures: string[] = [];
    let fiveXx = 0;
    const fiveXxByMode: Record<Mode, number> = { body: 0, path: 0, query: 0 };
    let stacks = 0;
    let resignIns = 0;
    let next = 0;
    const admitted = new Map<string, Set<Caller>>();
    const started = performance.now();

    async function one() {
      const route = pick(ROUTE_TABLE);
      // Half the time a caller the route has let in before, so bodies get past the role check.
      const key = `${route.method} ${route.path}`;
      const known = [...(admitted.get(key) ?? [])];
      const caller: Caller = known.length && rand() < 0.5 ? pick(known) : pick([...ROLES, 'signed out'] as const);
      const isWrite = route.method !== 'GET';
      const mode: Mode = isWrite ? pick(['body', 'body', 'path', 'query'] as const) : pick(['path', 'query'] as const);
      let path = route.path.replace(/:(\w+)/g, (_m, name: string) =>
        mode === 'path' && rand() < 0.7 ? pick(EDGE_SEGMENTS) : idFor(route.path, name),
      );
      if (mode === 'path' && rand() < 0.2) path += `/${pick(EDGE_SEGMENTS)}`;
      const input = ROUTE_INPUTS.get(`${route.method} ${route.path}`);
      if (mode === 'query') path += `?${queryOf(input?.query)}`;
      const body = isWrite ? (mode === 'body' ? bodyOf(input?.body) : input ? JSON.stringify(sampleOf(input.body, src)) : '{}') : undefined;
      const session = sessions.get(caller)!;
      const headers: Record<string, string> = { cookie: session.cookie, accept: 'application/json' };
      if (isWrite) Object.assign(headers, { 'content-type': 'application/json', 'x-csrf-token': session.csrf });
      const res = await fetch(`${base}${path}`, { method: route.method, headers, body });
      const text = await res.text();
      byMode[mode]++;
      byCaller[caller] = (byCaller[caller] ?? 0) + 1;
      statuses[res.status] = (statuses[res.status] ?? 0) + 1;
      const what = `${route.method} ${path.slice(0, 300)} as ${caller} (${mode}) body=${(body ?? '').slice(0, 300)} → ${res.status} ${text.slice(0, 300)}`;
      if (res.status !== 401 && res.status !== 403) admitted.set(key, (admitted.get(key) ?? new Set()).add(caller));
      if (trace) appendFileSync(trace, `${what}\n`);
      if (res.status >= 500) {
        fiveXx++;
        fiveXxByMode[mode]++;
        if (failures.length < 30) failures.push(what);
      }
      if (STACK.some((re) => re.test(text))) {
        stacks++;
        if (failures.length < 30) failures.push(`stack: ${what}`);
      }
      // A fuzzed request may sign its caller out (DELETE /api/session, a role removed): sign in again.
      if (
        caller !== 'signed out' &&
        (res.status === 401 || res.status === 403) &&
        /unauthenticated|session_expired|csrf_failed/.test(text)
      ) {
        resignIns++;
        sessions.set(caller, await openSession(base, emails[caller]).catch(() => session));
      }
    }

    await Promise.all(
      Array.from({ length: CONCURRENCY }, async () => {
        while (next < TOTAL) {
          next++;
          await one();
        }
      }),
    );
    const seconds = (performance.now() - started) / 1000;
    await app.stop();

    console.log(`\nfuzz: seed ${SEED}, ${TOTAL} requests over ${ROUTE_TABLE.length} routes in ${seconds.toFixed(1)} s`);
    console.log(
      `  by mode:   ${Object.entries(byMode)
        .map(([k, v]) => `${k} ${v}`)
        .join(', ')}`,
    );
    console.log(
      `  by caller: ${Object.entries(byCaller)
        .map(([k, v]) => `${k} ${v}`)
        .join(', ')}`,
    );
    console.log(
      `  statuses:  ${Object.entries(statuses)
        .map(([k, v]) => `${k} × ${v}`)
        .join(', ')}`,
    );
    console.log(
      `  5xx: ${fiveXx} (body ${fiveXxByMode.body}, path ${fiveXxByMode.path}, query ${fiveXxByMode.query}); answers with a stack: ${stacks}; callers signed in again: ${resignIns}`,
    );
    for (const f of failures) console.log(`  ✗ ${f}`);
    if (fiveXx > 0 || stacks > 0) process.exitCode = 1;
  } finally {
    rmSync(storageDir, { recursive: true, force: true });
    db.cluster?.stop();
  }
}

await main();
