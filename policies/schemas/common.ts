import { z } from 'zod';

export const UuidSchema = z.uuid({ message: 'must be a valid id' });

/** CR and LF are refused so an address can never smuggle extra mail headers. */
export const EmailSchema = z
  .string({ message: 'is required' })
  .trim()
  .toLowerCase()
  .max(254, { message: 'must be at most 254 characters' })
  .refine((v) => !/[\r\n]/.test(v), { message: 'must not contain line breaks' })
  .pipe(z.email({ message: 'must be a valid e-mail address' }));

export const DisplayNameSchema = z
  .string({ message: 'is required' })
  .trim()
  .min(1, { message: 'is required' })
  .max(120, { message: 'must be at most 120 characters' })
  .refine((v) => !/[\r\n]/.test(v), { message: 'must not contain line breaks' });

/** A calendar date without time, as ISO 'YYYY-MM-DD'. */
export const IsoDateSchema = z.iso.date({ message: 'must be a date (YYYY-MM-DD)' });

export const VersionSchema = z.number({ message: 'is required' }).int().min(1);

export const UNITS = ['kg', 'lb'] as const;
export type Unit = (typeof UNITS)[number];
