import { z } from 'zod';

/** A calendar feed token: 256 random bits as base64url (43 characters), never anything else. */
export const CalendarTokenParamsSchema = z.strictObject({
  token: z.string().regex(/^[A-Za-z0-9_-]{43}$/, 'is not a calendar feed address'),
});
