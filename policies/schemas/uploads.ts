import { z } from 'zod';
import { isTimeZone } from '../today';
import { IsoDateSchema, UuidSchema, VersionSchema, isStorableText, text, numberError } from './common';
import { LETTER_PAPERS } from '../letter-paper';
import { CountrySchema } from './organization-signup';

const line = (max: number) =>
  text(max)
    .min(1, { message: 'is required' })
    .refine((v) => !/[\r\n]/.test(v), { message: 'must not contain line breaks' });

/** Text fields sent with a case document (multipart form fields, sent before the file). */
export const CaseDocumentFieldsSchema = z.strictObject({
  title: line(200),
  documentDate: IsoDateSchema,
  issuedBy: line(200),
});
export type CaseDocumentFieldsInput = z.infer<typeof CaseDocumentFieldsSchema>;

/** Text fields sent with a technique clip (multipart form fields, sent before the file). */
export const ClipFieldsSchema = z.strictObject({
  athleteId: UuidSchema,
  trainingLogId: UuidSchema,
  exercise: line(200),
  caption: text(500)
    .optional()
    .transform((v) => (v ? v : undefined)),
});
export type ClipFieldsInput = z.infer<typeof ClipFieldsSchema>;

export const ClipListQuerySchema = z.strictObject({
  athleteId: UuidSchema.optional(),
  trainingLogId: UuidSchema.optional(),
});

export const ClipNoteCreateSchema = z.strictObject({
  atMs: z
    .number(numberError('is required'))
    .int({ message: 'must be whole milliseconds' })
    .min(0, { message: 'cannot be negative' })
    .max(3_600_000, { message: 'must be within the first hour' }),
  body: text(1000).min(1, { message: 'is required' }),
});
export type ClipNoteCreateInput = z.infer<typeof ClipNoteCreateSchema>;

export const OrganizationSettingsSchema = z.strictObject({
  name: line(200).optional(),
  emergencyNumber: text(30)
    .min(1, { message: 'is required' })
    .regex(/^[0-9+()\- ]+$/, { message: 'may contain digits, spaces, +, - and brackets only' })
    .optional(),
  guardiansSeeClips: z.boolean({ message: 'must be true or false' }).optional(),
  /** The zone whose calendar day is the organization's "today" (policies/today.ts). */
  timeZone: z
    .string({ message: 'must be an IANA time zone such as America/Chicago' })
    .trim()
    // One check, so a bad value gets the one sentence (the column holds 64 characters).
    .refine((v) => v.length <= 64 && isStorableText(v) && isTimeZone(v), { message: 'must be an IANA time zone such as America/Chicago' })
    .optional(),
  /** Paper for clearance letters; null: the paper of the time zone's country (policies/letter-paper.ts). */
  letterPaper: z.enum(LETTER_PAPERS, { message: 'must be letter or a4 (or empty: by country)' }).nullable().optional(),
  /** ISO 3166-1 alpha-2; a number that followed the old country follows the new one (policies/emergency-numbers.ts). */
  country: CountrySchema.optional(),
  version: VersionSchema,
});
export type OrganizationSettingsInput = z.infer<typeof OrganizationSettingsSchema>;
