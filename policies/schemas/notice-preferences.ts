import { z } from 'zod';
import { ALWAYS_EMAILED_KINDS, SWITCHABLE_KINDS } from '../notice-kinds';

const emergencyMessage = 'emergency notices are always e-mailed and cannot be switched off';

/**
 * Which notices a person wants by e-mail: only the kinds named change. An emergency kind may be sent
 * as true (nothing changes) but never false — the refusal names the field.
 */
export const NoticePreferencesUpdateSchema = z.strictObject({
  email: z.strictObject({
    ...Object.fromEntries(SWITCHABLE_KINDS.map((k) => [k, z.boolean({ message: 'must be true or false' }).optional()])),
    ...Object.fromEntries(ALWAYS_EMAILED_KINDS.map((k) => [k, z.literal(true, { message: emergencyMessage }).optional()])),
  } as Record<string, z.ZodOptional<z.ZodBoolean> | z.ZodOptional<z.ZodLiteral<true>>>),
});
export type NoticePreferencesUpdateInput = z.infer<typeof NoticePreferencesUpdateSchema>;
