// Upgrades of a build's backlog: the page, one upgrade with its lines, its history, as each role may
// read them (the value added is money).
import { z } from 'zod';
import { AREAS, INSTALL_STATES, SAFETY_FLAGS, SEGMENT_STATES } from '../domain';
import { audiences, day, idNumber, timestamp, type RouteTable, type Seen } from './common';
import { ImportRefused, ImportReport, PartForCrew, PartForMoney, PartForRetail, type PartSeen } from './part';
import { RemovedPartForCrew, RemovedPartForMoney, type RemovedPartSeen } from './removedPart';
import { LabourEntry } from './labour';
import { Expense } from './expense';

export const UpgradeForCrew = z.object({
  id: idNumber,
  buildId: idNumber,
  title: z.string(),
  replaces: z.string().nullable(),
  becomes: z.string().nullable(),
  area: z.enum(AREAS),
  estimatedHours: z.number(),
  priority: z.number().int(),
  safetyFlags: z.array(z.enum(SAFETY_FLAGS)),
  installState: z.enum(INSTALL_STATES),
  installSegment: z.enum(SEGMENT_STATES),
  demoSegment: z.enum(SEGMENT_STATES),
  installedOn: day.nullable(),
  episodeId: idNumber.nullable(),
  episodePosition: z.number().int().nullable(),
  notes: z.string().nullable(),
  tireFrom: z.string().nullable(),
  tireTo: z.string().nullable(),
  prerequisiteIds: z.array(idNumber),
  version: z.number().int(),
});
export type UpgradeForCrew = z.infer<typeof UpgradeForCrew>;
export const UpgradeForMoney = UpgradeForCrew.extend({ valueAddedCents: z.number().int() });
export type UpgradeForMoney = z.infer<typeof UpgradeForMoney>;
export type UpgradeSeen = Seen<UpgradeForMoney, UpgradeForCrew>;
export const Upgrade = audiences(UpgradeForMoney, UpgradeForCrew);

const page = <S extends z.ZodType>(u: S) =>
  z.object({ upgrades: z.array(u), total: z.number().int(), page: z.number().int(), pageSize: z.number().int() });
const one = <S extends z.ZodType>(u: S) => z.object({ upgrade: u });
export const UpgradePage = audiences(page(UpgradeForMoney), page(UpgradeForCrew));
export type UpgradePage = z.infer<typeof UpgradePage.crew> & { upgrades: UpgradeSeen[] };
export const UpgradeAnswer = audiences(one(UpgradeForMoney), one(UpgradeForCrew));
export type UpgradeAnswer = { upgrade: UpgradeSeen };

export const FlagCaution = z.object({ flag: z.enum(SAFETY_FLAGS), label: z.string(), caution: z.string() });

const detail = <U extends z.ZodType, P extends z.ZodType, R extends z.ZodType>(u: U, p: P, r: R) =>
  z.object({
    upgrade: u,
    /** The safety cautions of its flags, in our own words (shared/safety.ts). */
    cautions: z.array(FlagCaution),
    parts: z.array(p),
    removedParts: z.array(r),
    labour: z.array(LabourEntry),
  });
/** One upgrade with its lines; expenses only for money roles (the others do not get the list at all). */
export const UpgradeDetail = audiences(
  detail(UpgradeForMoney, PartForMoney, RemovedPartForMoney).extend({ expenses: z.array(Expense) }),
  detail(UpgradeForCrew, PartForCrew, RemovedPartForCrew),
  detail(UpgradeForCrew, PartForRetail, RemovedPartForCrew),
);
/** The detail as a screen holds it: money fields and the expenses when the person may see them. */
export type UpgradeDetail = Omit<z.infer<typeof UpgradeDetail.crew>, 'upgrade' | 'parts' | 'removedParts'> & {
  upgrade: UpgradeSeen;
  parts: PartSeen[];
  removedParts: RemovedPartSeen[];
  expenses?: Expense[];
};

/** One history entry; `changes` holds only fields the reader's contract for that record names. */
export const ActivityRow = z.object({
  id: z.number().int(),
  entity: z.string(),
  entityId: z.number().int().nullable(),
  action: z.string(),
  summary: z.string(),
  userId: z.number().int().nullable(),
  userName: z.string().nullable(),
  createdAt: timestamp,
  changes: z.record(z.string(), z.unknown()),
  /** The changes in words, as the server allows this person to see them. */
  readable: z.array(z.object({ field: z.string(), from: z.string(), to: z.string() })),
});
export type ActivityRow = z.infer<typeof ActivityRow>;
export const ActivityAnswer = z.object({ activity: z.array(ActivityRow) });

export const upgradeRoutes = {
  'GET /api/builds/:buildId/upgrades': UpgradePage,
  'POST /api/builds/:buildId/upgrades': UpgradeAnswer,
  'POST /api/builds/:buildId/upgrades/import': ImportReport,
  'POST /api/builds/:buildId/upgrades/import 400': ImportRefused,
  'GET /api/builds/:buildId/upgrades/:upgradeId': UpgradeDetail,
  'PATCH /api/builds/:buildId/upgrades/:upgradeId': UpgradeAnswer,
  'PUT /api/builds/:buildId/upgrades/:upgradeId/prerequisites': UpgradeAnswer,
  'GET /api/builds/:buildId/upgrades/:upgradeId/activity': ActivityAnswer,
} satisfies RouteTable;
