import { randomBytes } from 'node:crypto';
import bcrypt from 'bcryptjs';
import { dictionary } from '@zxcvbn-ts/language-common';
import { AppError } from '../core/errors';

/** zxcvbn-ts's list of ~49,000 common passwords (from breach corpora), loaded once. */
let common: Set<string> | null = null;
function commonPasswords(): Set<string> {
  common ??= new Set((dictionary['passwords-common'] as string[]).map((p) => p.toLowerCase()));
  return common;
}

export function isCommonPassword(password: string): boolean {
  return commonPasswords().has(password.toLowerCase());
}

/** The server-side half of the password policy (length is checked by the shared zod schema). */
export function assertAcceptablePassword(password: string): void {
  if (isCommonPassword(password)) {
    throw new AppError('validation_failed', 'Please check the form: password is too common; choose a longer, less guessable one.', {
      password: ['is too common; choose a longer, less guessable one (a short sentence works well)'],
    });
  }
}

export function hashPassword(password: string, cost: number): Promise<string> {
  return bcrypt.hash(password, cost);
}

/** A bcrypt hash of nothing anyone knows, compared against when the e-mail is unknown. */
let dummyHash: Promise<string> | null = null;

/**
 * Whether `password` matches `hash`. Without a hash (an unknown e-mail, or an account with no password yet) the password is compared
 * against a dummy hash of the same cost, so both answers take the same time and the timing does not
 * tell which addresses have an account (ASVS 5.0 V6.3.8).
 */
export async function passwordMatches(password: string, hash: string | null | undefined, cost: number): Promise<boolean> {
  dummyHash ??= bcrypt.hash(randomBytes(16).toString('hex'), cost);
  // An empty hash is an account made by a roster import whose invitation is not yet accepted: it is
  // compared like an unknown address, so it never matches and takes the same time.
  const ok = await bcrypt.compare(password, hash || (await dummyHash));
  return ok && !!hash;
}
