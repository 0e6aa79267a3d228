// Building blocks for the zod schemas that server and client share.
import { z } from 'zod';
import { parseUrl } from '../webUrl';
// Every schema built from these blocks speaks in words (see errorMap.ts).
import './errorMap';

export const id = z.coerce.number().int().positive();
export const isoDate = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'must be a date as YYYY-MM-DD')
  .refine(
    (s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s),
    'is not a real date',
  );
export const cents = z
  .number()
  .int('must be whole cents')
  .min(0, 'cannot be negative')
  .max(2_000_000_000, 'is too large');
export const hours = z.number().min(0, 'cannot be negative').max(1000, 'is too large');
// PostgreSQL text cannot hold U+0000; refusing it here gives a 400 naming the field everywhere.
const NUL = '\u0000';
/** A string without NUL characters: the base of every text field. */
export const safeString = () => z.string().refine((s) => !s.includes(NUL), 'must not contain a NUL character');
export const text = (max: number) => safeString().trim().max(max, `must be at most ${max} characters`);
export const requiredText = (max: number) => text(max).min(1, 'is required');
export const optionalText = (max: number) =>
  text(max)
    .nullish()
    .transform((v) => (v === '' || v === undefined ? null : v));
export const httpUrl = safeString()
  .trim()
  .max(2000)
  .refine((s) => {
    try {
      const u = parseUrl(s);
      return u.protocol === 'http:' || u.protocol === 'https:';
    } catch {
      return false;
    }
  }, 'must be an http or https address');
export const email = safeString().trim().toLowerCase().max(254).email('must be an e-mail address');
export const password = safeString().min(8, 'must be at least 8 characters').max(200);

export const pageQuery = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(500).default(50),
});
