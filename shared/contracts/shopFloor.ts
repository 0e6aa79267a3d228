// Contracts of the shop floor (/api/builds/:buildId/shop-floor): in-bay work and the episode being
// worked, each upgrade with its parts, cautions and hours. Installers read it as crew (no shop cost,
// no retail price, no value added); the producer and owner as money.
import { z } from 'zod';
import { EPISODE_STATES } from '../domain';
import { audiences, day, idNumber } from './common';
import type { RouteTable } from './common';
import { Episode } from './episode';
import { PartForCrew, PartForMoney } from './part';
import { FlagCaution, UpgradeAnswer, UpgradeForCrew, UpgradeForMoney } from './upgrade';

/** Hours logged on an upgrade (or today): this person's and everyone's. */
export const Hours = z.object({ mine: z.number().min(0), everyone: z.number().min(0) });
export type Hours = z.infer<typeof Hours>;

const episodeRef = z.object({
  id: idNumber,
  number: z.number().int(),
  title: z.string(),
  state: z.enum(EPISODE_STATES),
});

const item = <U extends z.ZodType, P extends z.ZodType>(upgrade: U, part: P) =>
  z.object({
    upgrade,
    parts: z.array(part),
    prerequisitesMet: z.boolean(),
    /** Titles of prerequisites not installed yet. */
    blockedBy: z.array(z.string()),
    cautions: z.array(FlagCaution),
    /** This person has read (and acknowledged) the safety caution. */
    cautionRead: z.boolean(),
    hours: Hours,
  });
/** In-bay work also names its episode (it may be another episode than the one shown). */
const inBayItem = <U extends z.ZodType, P extends z.ZodType>(upgrade: U, part: P) =>
  item(upgrade, part).extend({ episode: episodeRef.nullable() });

const shopFloor = <U extends z.ZodType, P extends z.ZodType>(upgrade: U, part: P) =>
  z.object({
    episode: Episode.nullable(),
    inBay: z.array(inBayItem(upgrade, part)),
    upgrades: z.array(item(upgrade, part)),
    /** Episodes an installer may switch to. */
    choices: z.array(episodeRef.extend({ shootDate: day.nullable() })),
    today: Hours.extend({ date: day }),
  });

export const ShopFloorForMoney = shopFloor(UpgradeForMoney, PartForMoney);
export type ShopFloorForMoney = z.infer<typeof ShopFloorForMoney>;
export const ShopFloorForCrew = shopFloor(UpgradeForCrew, PartForCrew);
export type ShopFloorForCrew = z.infer<typeof ShopFloorForCrew>;
export const ShopFloor = audiences(ShopFloorForMoney, ShopFloorForCrew);

/** One card of the shop floor as a screen holds it: crew fields, money fields when sent. */
export type ShopFloorItem = z.infer<ReturnType<typeof item<typeof UpgradeForCrew, typeof PartForCrew>>> & {
  upgrade: z.infer<typeof UpgradeForCrew> & Partial<Pick<z.infer<typeof UpgradeForMoney>, 'valueAddedCents'>>;
  parts: (z.infer<typeof PartForCrew> &
    Partial<Pick<z.infer<typeof PartForMoney>, 'unitCostCents' | 'retailPriceCents'>>)[];
  episode?: z.infer<typeof episodeRef> | null;
};
/** The shop floor as a screen holds it. */
export type ShopFloorSeen = Omit<ShopFloorForCrew, 'inBay' | 'upgrades'> & {
  inBay: ShopFloorItem[];
  upgrades: ShopFloorItem[];
};

export const shopFloorRoutes = {
  'GET /api/builds/:buildId/shop-floor': ShopFloor,
  'POST /api/builds/:buildId/shop-floor/upgrades/:upgradeId/step-back': UpgradeAnswer,
} satisfies RouteTable;
