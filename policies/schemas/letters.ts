import { z } from 'zod';
import { IsoDateSchema, UuidSchema, VersionSchema, text } from './common';

const Line = (max: number) =>
  text(max)
    .min(1, { message: 'is required' })
    .refine((v) => !/[\r\n]/.test(v), { message: 'must be one line' });

export const LetterCreateSchema = z
  .strictObject({
    athleteId: UuidSchema,
    decision: z.enum(['full', 'limited'], { message: 'must be full or limited' }),
    effectiveFrom: IsoDateSchema,
    /** Valid until / next review date. */
    validUntil: IsoDateSchema.nullable().optional(),
    /** Plain-words limits; when omitted for a limited decision, the limits in force on the start date are used. */
    limits: z.array(Line(300)).max(30).optional(),
    credential: Line(80),
    licenceNumber: Line(80),
    familyNote: text(1500).default(''),
  })
  .refine((l) => !l.validUntil || l.validUntil >= l.effectiveFrom, { message: 'must be on or after the start date', path: ['validUntil'] });
export type LetterCreateInput = z.infer<typeof LetterCreateSchema>;

export const LetterUpdateSchema = z.strictObject({
  decision: z.enum(['full', 'limited'], { message: 'must be full or limited' }).optional(),
  effectiveFrom: IsoDateSchema.optional(),
  validUntil: IsoDateSchema.nullable().optional(),
  limits: z.array(Line(300)).max(30).optional(),
  credential: Line(80).optional(),
  licenceNumber: Line(80).optional(),
  familyNote: text(1500).optional(),
  version: VersionSchema,
});
export type LetterUpdateInput = z.infer<typeof LetterUpdateSchema>;

export const LetterSignSchema = z.strictObject({
  /** The clinician types their full name as the signature. */
  signature: Line(120),
  version: VersionSchema,
});

/** Human-typable: Crockford base32, 20 characters in groups of four (100 random bits). */
export const CheckCodeSchema = z.strictObject({
  code: text(40)
    .min(16, { message: 'is too short' })
    .max(40, { message: 'is too long' })
    .regex(/^[0-9A-Za-z -]+$/, { message: 'may contain only letters, digits and dashes' }),
});
