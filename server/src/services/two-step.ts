import { createCipheriv, createDecipheriv, createHmac, hkdfSync, randomBytes, randomInt } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { IsNull } from 'typeorm';
import { Secret, TOTP } from 'otpauth';
import QRCode from 'qrcode';
import { isAppCode } from '../../../policies/schemas';
import type { Config } from '../config';
import { TotpRecoveryCode, UserTotp } from '../entities';

/** Codes change every 30 seconds; one step either side is accepted for clocks that drift. */
export const TOTP_PERIOD = 30;
const WINDOW = 1;
export const RECOVERY_CODE_COUNT = 10;
/** 32 letters and digits without i, l, o and u, so a code read aloud or copied by hand is unambiguous. */
const RECOVERY_ALPHABET = 'abcdefghjkmnpqrstvwxyz0123456789';

/** TOTP_KEY as 32 bytes: 64 hex characters or base64(url). Null when it is neither. */
export function parseTotpKey(value: string): Buffer | null {
  const v = value.trim();
  if (/^[0-9a-fA-F]{64}$/.test(v)) return Buffer.from(v, 'hex');
  const b = Buffer.from(v, 'base64');
  return b.length === 32 ? b : null;
}

const keys = new WeakMap<Config, Buffer>();
/**
 * The key that encrypts authenticator secrets and keys the recovery-code hashes: TOTP_KEY when set,
 * otherwise derived from SESSION_SECRET with HKDF (so one secret to keep, but rotating it then means
 * everyone sets up their app again).
 */
export function twoStepKey(config: Config): Buffer {
  let key = keys.get(config);
  if (!key) {
    if (config.TOTP_KEY) {
      key = parseTotpKey(config.TOTP_KEY) ?? undefined;
      if (!key) throw new Error('TOTP_KEY must be 32 bytes, written as 64 hex characters or base64');
    } else {
      key = Buffer.from(hkdfSync('sha256', config.SESSION_SECRET, 'loadline', 'two-step secret encryption v1', 32));
    }
    keys.set(config, key);
  }
  return key;
}

/** AES-256-GCM; the user id is bound in as associated data, so a secret copied to another row fails. */
export function encryptSecret(key: Buffer, userId: string, secretBase32: string): string {
  const iv = randomBytes(12);
  const cipher = createCipheriv('aes-256-gcm', key, iv);
  cipher.setAAD(Buffer.from(userId));
  const ct = Buffer.concat([cipher.update(secretBase32, 'utf8'), cipher.final()]);
  return ['v1', iv.toString('base64url'), cipher.getAuthTag().toString('base64url'), ct.toString('base64url')].join('.');
}

export function decryptSecret(key: Buffer, userId: string, stored: string): string {
  const [version, iv, tag, ct] = stored.split('.');
  if (version !== 'v1' || !iv || !tag || !ct) throw new Error('unknown two-step secret format');
  const decipher = createDecipheriv('aes-256-gcm', key, Buffer.from(iv, 'base64url'));
  decipher.setAAD(Buffer.from(userId));
  decipher.setAuthTag(Buffer.from(tag, 'base64url'));
  return Buffer.concat([decipher.update(Buffer.from(ct, 'base64url')), decipher.final()]).toString('utf8');
}

export function totpFor(secretBase32: string, label: string): TOTP {
  return new TOTP({
    issuer: 'Loadline',
    label,
    algorithm: 'SHA1',
    digits: 6,
    period: TOTP_PERIOD,
    secret: Secret.fromBase32(secretBase32),
  });
}

/** A new 160-bit secret, its otpauth:// address and that address as a QR code image. */
export async function newAuthenticatorSecret(label: string): Promise<{ secret: string; otpauthUri: string; qrDataUrl: string }> {
  const secret = new Secret({ size: 20 }).base32;
  const otpauthUri = totpFor(secret, label).toString();
  const qrDataUrl = await QRCode.toDataURL(otpauthUri, {
    errorCorrectionLevel: 'M',
    margin: 2,
    width: 240,
    color: { dark: '#14202e', light: '#fffdf8' },
  });
  return { secret, otpauthUri, qrDataUrl };
}

/**
 * The time step a code belongs to, if it is valid now (±1 step) and newer than the last one used;
 * otherwise null. A code already used cannot be used again, even inside its 90-second window.
 */
export function acceptedStep(secretBase32: string, code: string, lastUsedStep: string | null, now = Date.now()): number | null {
  const delta = totpFor(secretBase32, '').validate({ token: code, timestamp: now, window: WINDOW });
  if (delta === null) return null;
  const step = Math.floor(now / 1000 / TOTP_PERIOD) + delta;
  if (lastUsedStep !== null && step <= Number(lastUsedStep)) return null;
  return step;
}

export function recoveryCodeHash(key: Buffer, normalised: string): string {
  return createHmac('sha256', key).update(`recovery:${normalised}`).digest('hex');
}

/** Ten codes like `k3v9q-2mfhx`: 50 random bits each, shown once, stored as keyed hashes. */
export function newRecoveryCodes(): string[] {
  return Array.from({ length: RECOVERY_CODE_COUNT }, () => {
    const chars = Array.from({ length: 10 }, () => RECOVERY_ALPHABET[randomInt(RECOVERY_ALPHABET.length)]).join('');
    return `${chars.slice(0, 5)}-${chars.slice(5)}`;
  });
}

export const normaliseCode = (code: string) => code.replace(/[\s-]/g, '').toLowerCase();

/** The person's authenticator row, locked for the rest of the transaction. */
export function lockTotp(m: EntityManager, userId: string): Promise<UserTotp | null> {
  return m.createQueryBuilder(UserTotp, 't').setLock('pessimistic_write').where('t.user_id = :userId', { userId }).getOne();
}

export async function isTwoStepOn(m: EntityManager, userId: string): Promise<boolean> {
  const row = await m.findOne(UserTotp, { where: { userId } });
  return !!row?.enabledAt;
}

/**
 * Checks a second-step code (app code or recovery code) for someone with two-step sign-in on, in the
 * caller's transaction: an app code moves last_used_step forward, a recovery code is used up.
 * Answers which kind worked, or null.
 */
export async function useSecondStepCode(
  m: EntityManager,
  key: Buffer,
  userId: string,
  code: string,
): Promise<'app' | 'recovery_code' | null> {
  const row = await lockTotp(m, userId);
  if (!row?.enabledAt) return null;
  const normalised = normaliseCode(code);
  if (isAppCode(normalised)) {
    const step = acceptedStep(decryptSecret(key, userId, row.secretEnc), normalised, row.lastUsedStep);
    if (step === null) return null;
    await m.update(UserTotp, { userId }, { lastUsedStep: String(step) });
    return 'app';
  }
  const recovery = await m
    .createQueryBuilder(TotpRecoveryCode, 'r')
    .setLock('pessimistic_write')
    .where('r.user_id = :userId AND r.code_hash = :hash AND r.used_at IS NULL', { userId, hash: recoveryCodeHash(key, normalised) })
    .getOne();
  if (!recovery) return null;
  await m.update(TotpRecoveryCode, { id: recovery.id }, { usedAt: new Date() });
  return 'recovery_code';
}

export async function recoveryCodesLeft(m: EntityManager, userId: string): Promise<number> {
  return m.count(TotpRecoveryCode, { where: { userId, usedAt: IsNull() } });
}
