import { describe, expect, it } from 'vitest';
import { Secret, TOTP } from 'otpauth';
import { loadConfig } from '../config';
import {
  acceptedStep,
  decryptSecret,
  encryptSecret,
  newRecoveryCodes,
  normaliseCode,
  parseTotpKey,
  recoveryCodeHash,
  twoStepKey,
  TOTP_PERIOD,
} from './two-step';

const SECRET = new Secret({ size: 20 }).base32;
const app = new TOTP({ algorithm: 'SHA1', digits: 6, period: TOTP_PERIOD, secret: Secret.fromBase32(SECRET) });
const USER = '5b0d2c1e-4f7a-4c1b-9a3e-2d6f8e9a0b1c';
const config = (over: Record<string, string> = {}) =>
  loadConfig({ DATABASE_URL: 'postgres://unused', SESSION_SECRET: 'a-session-secret-of-at-least-32-characters', ...over });

describe('authenticator secrets at rest (AES-256-GCM)', () => {
  const key = twoStepKey(config());

  it('round-trips, with a fresh IV each time', () => {
    const a = encryptSecret(key, USER, SECRET);
    const b = encryptSecret(key, USER, SECRET);
    expect(a).not.toBe(b);
    expect(a).not.toContain(SECRET);
    expect(decryptSecret(key, USER, a)).toBe(SECRET);
  });

  it('refuses a secret moved to another person, a changed byte, or another key', () => {
    const stored = encryptSecret(key, USER, SECRET);
    expect(() => decryptSecret(key, '00000000-0000-4000-8000-000000000000', stored)).toThrow();
    const parts = stored.split('.');
    const ct = Buffer.from(parts[3], 'base64url');
    ct[0] ^= 1;
    expect(() => decryptSecret(key, USER, [...parts.slice(0, 3), ct.toString('base64url')].join('.'))).toThrow();
    expect(() => decryptSecret(twoStepKey(config({ SESSION_SECRET: 'another-session-secret-of-32-characters!' })), USER, stored)).toThrow();
  });

  it('uses TOTP_KEY when set (hex or base64), else a key derived from SESSION_SECRET', () => {
    const hex = 'ab'.repeat(32);
    expect(twoStepKey(config({ TOTP_KEY: hex })).toString('hex')).toBe(hex);
    expect(parseTotpKey(Buffer.from(hex, 'hex').toString('base64'))?.toString('hex')).toBe(hex);
    expect(parseTotpKey('too short')).toBeNull();
    expect(() => config({ TOTP_KEY: 'too short' })).toThrow(/TOTP_KEY/);
    expect(twoStepKey(config())).toHaveLength(32);
    expect(twoStepKey(config()).equals(twoStepKey(config({ TOTP_KEY: hex })))).toBe(false);
  });
});

describe('app codes (RFC 6238, 30-second steps, one step either side)', () => {
  // A fixed instant in the middle of a step, so ±1 step is unambiguous.
  const now = Math.floor(Date.UTC(2026, 11, 2, 4, 0, 0) / 30_000) * 30_000 + 15_000;
  const step = now / 1000 / TOTP_PERIOD;
  const codeAt = (offsetSteps: number) => app.generate({ timestamp: now + offsetSteps * 30_000 });

  it('accepts the previous, current and next step and names the step used', () => {
    expect(acceptedStep(SECRET, codeAt(-1), null, now)).toBe(Math.floor(step) - 1);
    expect(acceptedStep(SECRET, codeAt(0), null, now)).toBe(Math.floor(step));
    expect(acceptedStep(SECRET, codeAt(1), null, now)).toBe(Math.floor(step) + 1);
  });

  it('refuses codes two steps away', () => {
    expect(acceptedStep(SECRET, codeAt(-2), null, now)).toBeNull();
    expect(acceptedStep(SECRET, codeAt(2), null, now)).toBeNull();
  });

  it('refuses a code whose step was already used, or an older one', () => {
    const used = String(Math.floor(step));
    expect(acceptedStep(SECRET, codeAt(0), used, now)).toBeNull();
    expect(acceptedStep(SECRET, codeAt(-1), used, now)).toBeNull();
    expect(acceptedStep(SECRET, codeAt(1), used, now)).toBe(Math.floor(step) + 1);
  });
});

describe('recovery codes', () => {
  it('are ten different codes of 10 unambiguous characters, hashed with a key', () => {
    const codes = newRecoveryCodes();
    expect(codes).toHaveLength(10);
    expect(new Set(codes).size).toBe(10);
    for (const c of codes) expect(c).toMatch(/^[a-hjkmnp-tv-z0-9]{5}-[a-hjkmnp-tv-z0-9]{5}$/);
    const key = twoStepKey(config());
    const h = recoveryCodeHash(key, normaliseCode(codes[0]));
    expect(h).toMatch(/^[0-9a-f]{64}$/);
    expect(recoveryCodeHash(key, normaliseCode(` ${codes[0].toUpperCase()} `))).toBe(h);
    expect(recoveryCodeHash(twoStepKey(config({ TOTP_KEY: 'cd'.repeat(32) })), normaliseCode(codes[0]))).not.toBe(h);
  });
});
