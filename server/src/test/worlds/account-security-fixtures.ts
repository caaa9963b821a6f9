import { expect } from 'vitest';
import request from 'supertest';
import type { Response } from 'supertest';
import type { Express } from 'express';
import type { DataSource } from 'typeorm';
import { Secret, TOTP } from 'otpauth';
import { Client } from '../harness';

/** Shared by the password reset and two-step sign-in test files. */

export const COOKIE = 'loadline.sid';
export const NEW_PASSWORD = 'a fresh and rather long passphrase';
export const uniqueEmail = (tag: string) => `${tag}-${Math.random().toString(36).slice(2, 10)}@test.example`;

export async function waitFor<T>(what: string, fn: () => Promise<T | null | undefined | false>, ms = 20_000): Promise<T> {
  const end = Date.now() + ms;
  for (;;) {
    const v = await fn();
    if (v) return v;
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

export const RESET_SUBJECT = 'Choose a new Loadline password';
export const resetMails = (ds: DataSource, to: string): Promise<{ text_body: string; subject: string }[]> =>
  ds.query(`SELECT text_body, subject FROM fake_mailbox WHERE envelope_to && $1 AND subject = $2 ORDER BY id`, [[to], RESET_SUBJECT]);

/** Asks for a reset and returns the token from the `count`-th reset e-mail that address received. */
export async function requestResetToken(app: Express, ds: DataSource, email: string, count = 1): Promise<string> {
  const c = await Client.anonymous(app);
  const res = await c.post('/api/password-reset', { email });
  expect(res.status).toBe(202);
  const mails = await waitFor(`reset e-mail #${count} to ${email}`, async () => {
    const m = await resetMails(ds, email);
    return m.length >= count ? m : null;
  });
  const token = mails[count - 1].text_body.match(/\/reset#([A-Za-z0-9_-]+)/)?.[1];
  expect(token).toBeTruthy();
  return token!;
}

export function cookieOf(res: Response): string {
  const raw = res.headers['set-cookie'] as unknown as string[] | undefined;
  const line = raw?.find((c) => c.startsWith(`${COOKIE}=`));
  expect(line, 'a session cookie').toBeDefined();
  return line!.split(';')[0].slice(COOKIE.length + 1);
}
export const replay = (app: Express, cookie: string, path: string) => request(app).get(path).set('Cookie', `${COOKIE}=${cookie}`);

export const auditCount = async (ds: DataSource, action: string, userId: string): Promise<number> =>
  (await ds.query(`SELECT count(*)::int AS n FROM audit_entries WHERE action = $1 AND subject_id = $2`, [action, userId]))[0].n;

export const totp = (secret: string) => new TOTP({ algorithm: 'SHA1', digits: 6, period: 30, secret: Secret.fromBase32(secret) });
/** The code for the next 30-second step: valid now (±1 step), and newer than the one used to enable. */
export const nextCode = (secret: string) => totp(secret).generate({ timestamp: Date.now() + 30_000 });

/** Turns two-step sign-in on for a signed-in client; returns the secret and the recovery codes. */
export async function enable(c: Client): Promise<{ secret: string; recoveryCodes: string[] }> {
  const setup = await c.post('/api/account/two-step/setup');
  expect(setup.status, JSON.stringify(setup.body)).toBe(200);
  const secret = setup.body.secret as string;
  const on = await c.post('/api/account/two-step/enable', { code: totp(secret).generate() });
  expect(on.status, JSON.stringify(on.body)).toBe(200);
  return { secret, recoveryCodes: on.body.recoveryCodes };
}
