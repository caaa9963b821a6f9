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
