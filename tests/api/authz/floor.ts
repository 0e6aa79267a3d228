// Matrix rows for the shop floor's marks (routes/shopFloor.ts) and the live-update stream (routes/events.ts).
import type { MatrixContext, MatrixRow } from './types';
import { Upgrade } from '../../../server/models';

export async function prepare(ctx: MatrixContext) {
  ctx.ids.floorUpgradeId = (await Upgrade.findOne({
    where: { buildId: Number(ctx.ids.buildId) },
    order: [['id', 'ASC']],
  }))!.id;
  const other = await Upgrade.create({
    buildId: Number(ctx.other.buildId),
    title: 'Other build floor upgrade',
    area: 'cabin',
    replaces: null,
    becomes: null,
    installedOn: null,
    episodeId: null,
    episodePosition: null,
    notes: null,
    tireFrom: null,
    tireTo: null,
  });
  ctx.other.floorUpgradeId = other.id;
}

const B = '/api/builds/:buildId';
const otherUpgrade = (suffix: string) => (ctx: MatrixContext) =>
  `/api/builds/${ctx.ids.buildId}/shop-floor/upgrades/${ctx.other.floorUpgradeId}/${suffix}`;
const own = (suffix: string) => (ctx: MatrixContext) =>
  `/api/builds/${ctx.ids.buildId}/shop-floor/upgrades/${ctx.ids.floorUpgradeId}/${suffix}`;

export const rows: MatrixRow[] = [
  // Invalid bodies, so an allowed caller gets 400 and nothing is stepped back or recorded.
  {
    method: 'POST',
    path: `${B}/shop-floor/upgrades/:upgradeId/step-back`,
    allow: ['installer', 'producer'],
    url: own('step-back'),
    body: () => ({ mark: 'colour' }),
    idor: otherUpgrade('step-back'),
  },
  {
    method: 'POST',
    path: `${B}/shop-floor/upgrades/:upgradeId/caution-read`,
    allow: ['installer', 'producer'],
    url: own('caution-read'),
    body: () => ({ bogus: 1 }),
    idor: otherUpgrade('caution-read'),
  },
  // An unknown query answers 400 before the stream opens, so the matrix never waits on it.
  {
    method: 'GET',
    path: `${B}/events`,
    allow: 'signed-in',
    url: (ctx) => `/api/builds/${ctx.ids.buildId}/events?bogus=1`,
    idor: (ctx) => `/api/builds/${Number(ctx.other.buildId) + 100000}/events?bogus=1`,
  },
];
