import { z } from 'zod';
import { DisplayNameSchema, EmailSchema, IsoDateSchema } from './common';
import { PasswordSchema } from './password';

export const SignInSchema = z.strictObject({
  email: EmailSchema,
  // Sign-in does not apply the password policy: it only needs something to compare.
  password: z.string({ message: 'is required' }).min(1, { message: 'is required' }).max(1024),
});
export type SignInInput = z.infer<typeof SignInSchema>;

export const InvitationTokenSchema = z.strictObject({
  token: z.string({ message: 'is required' }).regex(/^[A-Za-z0-9_-]{20,100}$/, { message: 'is not a valid invitation code' }),
});
export type InvitationTokenInput = z.infer<typeof InvitationTokenSchema>;

export const InvitationAcceptSchema = InvitationTokenSchema.extend({
  displayName: DisplayNameSchema,
  password: PasswordSchema,
  dateOfBirth: IsoDateSchema.optional(),
});
export type InvitationAcceptInput = z.infer<typeof InvitationAcceptSchema>;
