// Build payloads (create, update) shared by the build settings form and the API. The VIN is checked
// with shared/vin.ts: a wrong check digit is refused unless the person overrides it on purpose.
import { z } from 'zod';
import { checkVin } from '../vin';
import { isValidTimeZone } from '../dates';
import { COST_RECOGNITIONS } from '../costRecognition';
import { cents, isoDate, optionalText, requiredText, text } from './common';
import { currencyCode } from './sales';

const slug = z
  .string()
  .trim()
  .max(60, 'must be at most 60 characters')
  .regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, 'use lower-case letters, digits and single hyphens');
const campaign = z
  .string()
  .trim()
  .regex(/^[a-z0-9_-]{1,60}$/, 'use 1–60 lower-case letters, digits, - or _')
  .nullish()
  .transform((v) => v ?? null);
const vin = z
  .string()
  .trim()
  .toUpperCase()
  .max(17, 'must be at most 17 characters')
  .nullish()
  .transform((v) => (v === '' || v === undefined ? null : v));

const fields = {
  slug,
  name: requiredText(120),
  year: z.number().int('must be a whole year').min(1900, 'must be 1900 or later').max(2100, 'must be 2100 or earlier'),
  make: requiredText(60),
  model: requiredText(60),
  trim: text(60),
  vin,
  vinCheckOverridden: z.boolean(),
  mileage: z.number().int('must be whole miles').min(0, 'cannot be negative').max(2_000_000, 'is too large').nullable(),
  budgetCents: cents.nullable(),
  labourRateCents: cents.nullable(),
  shopHoursPerWeek: z.number().gt(0, 'must be more than 0').max(168, 'a week has 168 hours'),
  shootHoursPerEpisode: z.number().gt(0, 'must be more than 0').max(200, 'must be at most 200'),
  releaseCadenceDays: z.number().int('must be whole days').min(1, 'must be at least 1').max(365, 'must be at most 365'),
  startDate: isoDate,
  isPublic: z.boolean(),
  campaign,
  summary: optionalText(2000),
  timeZone: z.string().trim().refine(isValidTimeZone, 'must be an IANA time zone name such as America/Denver'),
  costRecognition: z.enum(COST_RECOGNITIONS, 'must be at fitting or at receipt'),
  currency: currencyCode,
  attributionWindowDays: z
    .number()
    .int('must be whole days')
    .min(0, 'cannot be negative')
    .max(365, 'must be at most 365'),
};

/** Adds the VIN check: structural problems always refuse; a wrong check digit refuses unless overridden. */
function vinRule(v: { vin?: string | null; vinCheckOverridden?: boolean }, ctx: z.RefinementCtx) {
  if (!v.vin) return;
  const c = checkVin(v.vin);
  if (c.valid) return;
  const onlyCheckDigit = c.checkDigit !== '' && v.vin.length === 17 && c.reason?.startsWith('Check digit');
  if (onlyCheckDigit && v.vinCheckOverridden) return;
  ctx.addIssue({ code: 'custom', path: ['vin'], message: c.reason ?? 'is not a valid VIN' });
}

export const createBuildSchema = z
  .strictObject({
    ...fields,
    trim: fields.trim.optional(),
    vin: fields.vin.optional(),
    vinCheckOverridden: fields.vinCheckOverridden.optional(),
    mileage: fields.mileage.optional(),
    budgetCents: fields.budgetCents.optional(),
    labourRateCents: fields.labourRateCents.optional(),
    shopHoursPerWeek: fields.shopHoursPerWeek.optional(),
    shootHoursPerEpisode: fields.shootHoursPerEpisode.optional(),
    releaseCadenceDays: fields.releaseCadenceDays.optional(),
    startDate: fields.startDate.optional(),
    isPublic: fields.isPublic.optional(),
    campaign: fields.campaign.optional(),
    summary: fields.summary.optional(),
    timeZone: fields.timeZone.optional(),
    costRecognition: fields.costRecognition.optional(),
    currency: fields.currency.optional(),
    attributionWindowDays: fields.attributionWindowDays.optional(),
  })
  .superRefine(vinRule);

export const updateBuildSchema = z
  .strictObject({
    slug: fields.slug.optional(),
    name: fields.name.optional(),
    year: fields.year.optional(),
    make: fields.make.optional(),
    model: fields.model.optional(),
    trim: fields.trim.optional(),
    vin: fields.vin.optional(),
    vinCheckOverridden: fields.vinCheckOverridden.optional(),
    mileage: fields.mileage.optional(),
    budgetCents: fields.budgetCents.optional(),
    labourRateCents: fields.labourRateCents.optional(),
    shopHoursPerWeek: fields.shopHoursPerWeek.optional(),
    shootHoursPerEpisode: fields.shootHoursPerEpisode.optional(),
    releaseCadenceDays: fields.releaseCadenceDays.optional(),
    startDate: fields.startDate.optional(),
    isPublic: fields.isPublic.optional(),
    campaign: fields.campaign.optional(),
    summary: fields.summary.optional(),
    timeZone: fields.timeZone.optional(),
    costRecognition: fields.costRecognition.optional(),
    currency: fields.currency.optional(),
    attributionWindowDays: fields.attributionWindowDays.optional(),
    version: z.number().int().min(0),
  })
  .superRefine(vinRule);

export type CreateBuildInput = z.infer<typeof createBuildSchema>;
export type UpdateBuildInput = z.infer<typeof updateBuildSchema>;
