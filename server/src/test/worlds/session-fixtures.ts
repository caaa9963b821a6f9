import { expect, vi } from 'vitest';
import request from 'supertest';
import type { Response } from 'supertest';
import type { Express } from 'express';
import type { DataSource } from 'typeorm';
import { Client } from '../harness';
import { TEST_PASSWORD } from '../factories';

/** Shared by the session test files. */
export const COOKIE = 'loadline.sid';

export interface ParsedCookie {
  value: string;
  attrs: Map<string, string | true>;
}

/** The session cookie from a response's Set-Cookie, with its attributes keyed in lower case. */
export function sessionCookie(res: Response): ParsedCookie | undefined {
  const raw = res.headers['set-cookie'] as unknown as string[] | undefined;
  const line = raw?.find((c) => c.startsWith(`${COOKIE}=`));
  if (!line) return undefined;
  const [first, ...rest] = line.split(';').map((p) => p.trim());
  const attrs = new Map<string, string | true>();
  for (const part of rest) {
    const eq = part.indexOf('=');
    if (eq === -1) attrs.set(part.toLowerCase(), true);
    else attrs.set(part.slice(0, eq).toLowerCase(), part.slice(eq + 1));
  }
  return { value: first.slice(COOKIE.length + 1), attrs };
}

/** The store's key for a signed cookie value `s:<sid>.<signature>`. */
export function sidOf(cookieValue: string): string {
  const v = decodeURIComponent(cookieValue);
  expect(v.startsWith('s:')).toBe(true);
  return v.slice(2, v.lastIndexOf('.'));
}

export async function sessionRows(ds: DataSource, sid: string): Promise<number> {
  const rows: { n: number }[] = await ds.query('SELECT count(*)::int AS n FROM "session" WHERE sid = $1', [sid]);
  return rows[0].n;
}

/** Replays a captured cookie with a bare request (no cookie jar), as an attacker holding it would. */
export function replay(app: Express, cookieValue: string, path: string) {
  return request(app).get(path).set('Cookie', `${COOKIE}=${cookieValue}`);
}

/** Signs in with a fresh anonymous client and returns the client plus the session cookie it got. */
export async function signInCapturing(app: Express, email: string) {
  const c = await Client.anonymous(app);
  const res = await c.signIn(email, TEST_PASSWORD);
  expect(res.status).toBe(200);
  const cookie = sessionCookie(res);
  expect(cookie).toBeDefined();
  return { c, res, cookie: cookie! };
}

export async function invitationToken(admin: Client, orgId: string, body: Record<string, unknown>): Promise<string> {
  const res = await admin.post(`/api/orgs/${orgId}/invitations`, body);
  expect(res.status).toBe(201);
  return new URL(res.body.link).hash.slice(1);
}

export const uniqueEmail = (tag: string) => `${tag}-${Math.random().toString(36).slice(2, 10)}@test.example`;

// Timeouts and rate-limit windows read the time from Date, and only Date is simulated below: a test
// steps past a window instead of waiting for it, whatever bcrypt's speed on a busy machine.
export const MIN = 60_000;
export const simulateClock = () => {
  vi.useFakeTimers({ toFake: ['Date'] });
  return Date.now();
};
