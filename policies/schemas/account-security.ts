import { z } from 'zod';
import { EmailSchema } from './common';
import { PasswordSchema } from './password';

export const PasswordResetRequestSchema = z.strictObject({ email: EmailSchema });
export type PasswordResetRequestInput = z.infer<typeof PasswordResetRequestSchema>;

export const PasswordResetConfirmSchema = z.strictObject({
  token: z.string({ message: 'is required' }).regex(/^[A-Za-z0-9_-]{20,100}$/, { message: 'is not a valid reset code' }),
  password: PasswordSchema,
});
export type PasswordResetConfirmInput = z.infer<typeof PasswordResetConfirmSchema>;

/**
 * A code from the authenticator app (6 digits, spaces allowed) or a recovery code (10 letters and
 * digits, a dash allowed). The server tells them apart by shape.
 */
export const SecondStepCodeSchema = z
  .string({ message: 'is required' })
  .transform((v) => v.replace(/[\s-]/g, '').toLowerCase())
  .refine((v) => /^\d{6}$/.test(v) || /^[a-z0-9]{10}$/.test(v), {
    message: 'must be the 6-digit code from your app or one of your recovery codes',
  });

export const isAppCode = (normalised: string) => /^\d{6}$/.test(normalised);

export const SecondStepSchema = z.strictObject({ code: SecondStepCodeSchema });
export type SecondStepInput = z.input<typeof SecondStepSchema>;

export const TwoStepEnableSchema = z.strictObject({
  code: z
    .string({ message: 'is required' })
    .transform((v) => v.replace(/\s/g, ''))
    .refine((v) => /^\d{6}$/.test(v), { message: 'must be the 6-digit code your app shows now' }),
});
export type TwoStepEnableInput = z.input<typeof TwoStepEnableSchema>;

export const TwoStepDisableSchema = z.strictObject({
  password: z.string({ message: 'is required' }).min(1, { message: 'is required' }).max(1024),
  code: SecondStepCodeSchema,
});
export type TwoStepDisableInput = z.input<typeof TwoStepDisableSchema>;
