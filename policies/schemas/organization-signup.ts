import { z } from 'zod';
import { isCountryCode } from '../countries';
import { isTimeZone } from '../today';
import { DisplayNameSchema, EmailSchema, isStorableText, line } from './common';
import { PasswordSchema } from './password';

export const COUNTRY_MESSAGE = 'must be a two-letter country code (ISO 3166-1) such as NO or US';
export const TIME_ZONE_MESSAGE = 'must be an IANA time zone such as America/Chicago';

/** A country code; lower case is read as upper case ("no" → "NO"). */
export const CountrySchema = z
  .string({ message: COUNTRY_MESSAGE })
  .trim()
  .toUpperCase()
  .refine((v) => isCountryCode(v), { message: COUNTRY_MESSAGE });

export const TimeZoneSchema = z
  .string({ message: TIME_ZONE_MESSAGE })
  .trim()
  // One check, so a bad value gets the one sentence (the column holds 64 characters).
  .refine((v) => v.length <= 64 && isStorableText(v) && isTimeZone(v), { message: TIME_ZONE_MESSAGE });

/** The public "start an organization" form: the organization and its first admin. */
export const OrganizationSignupSchema = z.strictObject({
  organizationName: line(200),
  country: CountrySchema,
  timeZone: TimeZoneSchema,
  adminName: DisplayNameSchema,
  email: EmailSchema,
  password: PasswordSchema,
});
export type OrganizationSignupInput = z.infer<typeof OrganizationSignupSchema>;

/** The link's code, from the confirmation e-mail (it rides in the link's fragment, never a URL's path or query). */
export const OrganizationSignupConfirmSchema = z.strictObject({
  token: z.string({ message: 'is required' }).regex(/^[A-Za-z0-9_-]{20,100}$/, { message: 'is not a valid confirmation code' }),
});
export type OrganizationSignupConfirmInput = z.infer<typeof OrganizationSignupConfirmSchema>;

/** `npm run org:create`: an operator makes an organization and invites its first admin. */
export const OrganizationCreateSchema = z.strictObject({
  name: line(200),
  adminEmail: EmailSchema,
  adminName: DisplayNameSchema.optional(),
  country: CountrySchema.optional(),
  timeZone: TimeZoneSchema.default('UTC'),
});
export type OrganizationCreateInput = z.infer<typeof OrganizationCreateSchema>;
