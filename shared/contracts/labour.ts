// Labour entries: hours, no money (the labour rate lives on the build), so one contract for every role.
import { z } from 'zod';
import { LABOUR_KINDS } from '../domain';
import { day, idNumber, type RouteTable } from './common';

export const LabourEntry = z.object({
  id: idNumber,
  buildId: idNumber,
  upgradeId: idNumber,
  userId: idNumber.nullable(),
  personName: z.string(),
  workedOn: day,
  hours: z.number(),
  kind: z.enum(LABOUR_KINDS),
  note: z.string().nullable(),
});
export type LabourEntry = z.infer<typeof LabourEntry>;

export const LabourList = z.object({ labour: z.array(LabourEntry) });
export type LabourList = z.infer<typeof LabourList>;
export const LabourAnswer = z.object({ labourEntry: LabourEntry });
export type LabourAnswer = z.infer<typeof LabourAnswer>;

export const labourRoutes = {
  'GET /api/builds/:buildId/labour': LabourList,
  'POST /api/builds/:buildId/labour': LabourAnswer,
  'PATCH /api/builds/:buildId/labour/:labourId': LabourAnswer,
} satisfies RouteTable;
