// Stock parts taken off the vehicle; their sale prices are money.
import { z } from 'zod';
import { DISPOSITIONS } from '../domain';
import { audiences, day, idNumber, type RouteTable, type Seen } from './common';

export const RemovedPartForCrew = z.object({
  id: idNumber,
  buildId: idNumber,
  upgradeId: idNumber.nullable(),
  description: z.string(),
  partNumber: z.string().nullable(),
  disposition: z.enum(DISPOSITIONS),
  soldOn: day.nullable(),
});
export type RemovedPartForCrew = z.infer<typeof RemovedPartForCrew>;
export const RemovedPartForMoney = RemovedPartForCrew.extend({
  expectedSaleCents: z.number().int().nullable(),
  actualSaleCents: z.number().int().nullable(),
});
export type RemovedPartForMoney = z.infer<typeof RemovedPartForMoney>;
export type RemovedPartSeen = Seen<RemovedPartForMoney, RemovedPartForCrew>;
export const RemovedPart = audiences(RemovedPartForMoney, RemovedPartForCrew);

const list = <S extends z.ZodType>(r: S) => z.object({ removedParts: z.array(r) });
const one = <S extends z.ZodType>(r: S) => z.object({ removedPart: r });
export const RemovedPartList = audiences(list(RemovedPartForMoney), list(RemovedPartForCrew));
export const RemovedPartAnswer = audiences(one(RemovedPartForMoney), one(RemovedPartForCrew));

export const removedPartRoutes = {
  'GET /api/builds/:buildId/removed-parts': RemovedPartList,
  'POST /api/builds/:buildId/removed-parts': RemovedPartAnswer,
  'PATCH /api/builds/:buildId/removed-parts/:removedPartId': RemovedPartAnswer,
} satisfies RouteTable;
