import { z } from 'zod';
import { isTimeZone } from '../today';
import { IsoDateSchema, UuidSchema } from './common';

const line = (max: number) =>
  z
    .string({ message: 'is required' })
    .trim()
    .min(1, { message: 'is required' })
    .max(max, { message: `must be at most ${max} characters` })
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
  caption: z
    .string()
    .trim()
    .max(500, { message: 'must be at most 500 characters' })
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
    .number({ message: 'is required' })
    .int({ message: 'must be whole milliseconds' })
    .min(0, { message: 'cannot be negative' })
    .max(3_600_000, { message: 'must be within the first hour' }),
  body: z
    .string({ message: 'is required' })
    .trim()
    .min(1, { message: 'is required' })
    .max(1000, { message: 'must be at most 1000 characters' }),
});
export type ClipNoteCreateInput = z.infer<typeof ClipNoteCreateSchema>;

export const OrganizationSettingsSchema = z.strictObject({
  name: line(200).optional(),
  emergencyNumber: z
    .string()
    .trim()
    .min(1, { message: 'is required' })
    .max(30, { message: 'must be at most 30 characters' })
    .regex(/^[0-9+()\- ]+$/, { message: 'may contain digits, spaces, +, - and brackets only' })
    .optional(),
  guardiansSeeClips: z.boolean({ message: 'must be true or false' }).optional(),
  /** The zone whose calendar day is the organization's "today" (policies/today.ts). */
  timeZone: z
    .string({ message: 'must be an IANA time zone such as America/Chicago' })
    .trim()
    .refine(isTimeZone, { message: 'must be an IANA time zone such as America/Chicago' })
    .optional(),
  version: z.number({ message: 'is required' }).int().min(1),
});
export type OrganizationSettingsInput = z.infer<typeof OrganizationSettingsSchema>;
