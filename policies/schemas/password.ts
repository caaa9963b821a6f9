import { z } from 'zod';

export const PASSWORD_MIN = 8;
/** bcrypt reads only the first 72 bytes; longer passwords are refused rather than cut silently. */
export const PASSWORD_MAX_BYTES = 72;

function utf8Length(value: string): number {
  return new TextEncoder().encode(value).length;
}

/**
 * Length rules only (no composition rules), shared by client and server. The server also refuses
 * common passwords from a published list, which is too large to ship to the browser.
 */
export const PasswordSchema = z
  .string({ message: 'is required' })
  .min(PASSWORD_MIN, { message: `must be at least ${PASSWORD_MIN} characters (15 or more is better)` })
  .refine((v) => utf8Length(v) <= PASSWORD_MAX_BYTES, {
    message: `must be at most ${PASSWORD_MAX_BYTES} bytes (about ${PASSWORD_MAX_BYTES} letters)`,
  });
