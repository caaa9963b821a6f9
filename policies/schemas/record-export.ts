import { z } from 'zod';
import { UuidSchema } from './common';

/** Ask for a person's whole record: the athlete's own, or a linked minor's (a guardian). */
export const RecordExportRequestSchema = z.strictObject({ athleteId: UuidSchema });
export type RecordExportRequestInput = z.infer<typeof RecordExportRequestSchema>;

/**
 * The secret of an e-mailed download link: 32 random bytes in base64url (43 characters). It rides in
 * the page's fragment and then in a POST body, never in a URL the server sees or logs.
 */
export const RecordExportTokenSchema = z.strictObject({
  token: z.string({ message: 'must be the code from the e-mailed link' }).regex(/^[A-Za-z0-9_-]{43}$/, {
    message: 'must be the code from the e-mailed link',
  }),
});
export type RecordExportTokenInput = z.infer<typeof RecordExportTokenSchema>;
