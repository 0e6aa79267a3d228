// Parts on the build's upgrades, as each role may read them (shop cost: money roles; retail price:
// money and retail roles).
import { z } from 'zod';
import { PART_CONDITIONS, PART_STATES } from '../domain';
import { audiences, day, ErrorAnswer, idNumber, type RouteTable, type Seen } from './common';

/** What every role reads of a part. */
export const PartForCrew = z.object({
  id: idNumber,
  buildId: idNumber,
  upgradeId: idNumber,
  partNumber: z.string(),
  description: z.string(),
  quantity: z.number().int(),
  supplier: z.string().nullable(),
  condition: z.enum(PART_CONDITIONS),
  productUrl: z.string().nullable(),
  expectedArrival: day.nullable(),
  orderedOn: day.nullable(),
  receivedOn: day.nullable(),
  state: z.enum(PART_STATES),
  /** The store's code for this part when it differs from the part number. */
  storeSku: z.string().nullable(),
  version: z.number().int(),
});
export type PartForCrew = z.infer<typeof PartForCrew>;
/** Marketing: the retail price, not the shop cost. */
export const PartForRetail = PartForCrew.extend({ retailPriceCents: z.number().int().nullable() });
export type PartForRetail = z.infer<typeof PartForRetail>;
/** Owner and producer: shop cost too. */
export const PartForMoney = PartForRetail.extend({ unitCostCents: z.number().int() });
export type PartForMoney = z.infer<typeof PartForMoney>;
/** A part as a screen holds it (money fields when the person may see them). */
export type PartSeen = Seen<PartForMoney, PartForCrew>;
export const Part = audiences(PartForMoney, PartForCrew, PartForRetail);

const partPage = <S extends z.ZodType>(p: S) =>
  z.object({ parts: z.array(p), total: z.number().int(), page: z.number().int(), pageSize: z.number().int() });
const partAnswer = <S extends z.ZodType>(p: S) => z.object({ part: p });
export const PartPage = audiences(partPage(PartForMoney), partPage(PartForCrew), partPage(PartForRetail));
export type PartPage = z.infer<typeof PartPage.money>;
export const PartAnswer = audiences(partAnswer(PartForMoney), partAnswer(PartForCrew), partAnswer(PartForRetail));
export type PartAnswer = z.infer<typeof PartAnswer.money>;

/** The answer of a CSV import (parts or backlog), dry run or not. */
export const ImportReport = z.object({
  ok: z.boolean(),
  /** The rows read (a preview of what is, or would be, written). */
  rows: z.array(z.record(z.string(), z.unknown())),
  errors: z.array(z.object({ line: z.number().int(), field: z.string().optional(), message: z.string() })),
  /** How many records a write added. */
  created: z.number().int().optional(),
});
export type ImportReport = z.infer<typeof ImportReport>;

/** A refused import (400): every problem, and nothing written. */
/** A refused import: its report beside the error, or a plain error when the request itself was wrong (no mapping, no file). */
export const ImportRefused = z.union([ImportReport.extend({ error: ErrorAnswer.shape.error }), ErrorAnswer]);
export type ImportRefused = z.infer<typeof ImportRefused>;

export const partRoutes = {
  'GET /api/builds/:buildId/parts': PartPage,
  'POST /api/builds/:buildId/parts': PartAnswer,
  'POST /api/builds/:buildId/parts/import': ImportReport,
  'POST /api/builds/:buildId/parts/import 400': ImportRefused,
  'PATCH /api/builds/:buildId/parts/:partId': PartAnswer,
} satisfies RouteTable;
