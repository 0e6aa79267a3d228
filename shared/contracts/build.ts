// Builds: the list everyone signed in reads, and one build; budget, labour rate and spend are money.
import { z } from 'zod';
import { audiences, day, idNumber, type RouteTable, type Seen } from './common';

export const BuildForCrew = z.object({
  id: idNumber,
  slug: z.string(),
  name: z.string(),
  year: z.number().int(),
  make: z.string(),
  model: z.string(),
  trim: z.string(),
  vin: z.string().nullable(),
  /** The VIN check was overridden for this VIN (sent with it, kept with it). */
  vinCheckOverridden: z.boolean(),
  mileage: z.number().int().nullable(),
  shopHoursPerWeek: z.number(),
  shootHoursPerEpisode: z.number(),
  releaseCadenceDays: z.number().int(),
  startDate: day,
  isPublic: z.boolean(),
  campaign: z.string().nullable(),
  summary: z.string().nullable(),
  /** IANA zone of the shop: "today" and default dates of this build. */
  timeZone: z.string(),
  /** When a part's cost becomes actual cost (shared/costRecognition.ts). */
  costRecognition: z.enum(['fitting', 'receipt']),
  /** ISO 4217 code the build's store sells in. */
  currency: z.string(),
  /** Days after an episode's release in which an untagged sale of a part it showed counts as assisted. */
  attributionWindowDays: z.number().int(),
  version: z.number().int(),
});
export type BuildForCrew = z.infer<typeof BuildForCrew>;
export const BuildForMoney = BuildForCrew.extend({
  budgetCents: z.number().int().nullable(),
  labourRateCents: z.number().int().nullable(),
});
export type BuildForMoney = z.infer<typeof BuildForMoney>;
export type BuildSeen = Seen<BuildForMoney, BuildForCrew>;
export const Build = audiences(BuildForMoney, BuildForCrew);

/** A row of the builds list: progress for everyone, spend for money roles. */
export const BuildRowForCrew = BuildForCrew.extend({ upgradesDone: z.number().int(), upgradesTotal: z.number().int() });
export const BuildRowForMoney = BuildForMoney.extend({
  upgradesDone: z.number().int(),
  upgradesTotal: z.number().int(),
  spentCents: z.number().int(),
});
export type BuildRowSeen = Seen<z.infer<typeof BuildRowForMoney>, z.infer<typeof BuildRowForCrew>>;

const list = <S extends z.ZodType>(b: S) => z.object({ builds: z.array(b) });
const one = <S extends z.ZodType>(b: S) => z.object({ build: b });
export const BuildList = audiences(list(BuildRowForMoney), list(BuildRowForCrew));
export const BuildAnswer = audiences(one(BuildForMoney), one(BuildForCrew));
export type BuildAnswer = { build: BuildSeen };

export const buildRoutes = {
  'GET /api/builds': BuildList,
  'POST /api/builds': BuildAnswer,
  'GET /api/builds/:buildId': BuildAnswer,
  'PATCH /api/builds/:buildId': BuildAnswer,
} satisfies RouteTable;
