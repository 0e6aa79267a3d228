// Matrix rows for builds, upgrades, parts, removed parts, labour, expenses and the backlog CSV
// (routes/builds.ts, upgrades.ts, parts.ts, removedParts.ts, labour.ts, expenses.ts).
import type { MatrixContext, MatrixRow } from './types';
import { Build, Expense, LabourEntry, Part, RemovedPart, Upgrade, User } from '../../../server/models';

export async function prepare(ctx: MatrixContext) {
  const tern = Number(ctx.ids.buildId);
  const other = Number(ctx.other.buildId);
  const installer = await User.findOne({ where: { email: 'installer@cedar-ridge.test' } });
  const upgrade = await Upgrade.findOne({ where: { buildId: tern }, order: [['id', 'ASC']] });
  ctx.ids.upgradeId = upgrade!.id;
  ctx.ids.partId = (await Part.findOne({ where: { buildId: tern }, order: [['id', 'ASC']] }))!.id;
  ctx.ids.removedPartId = (await RemovedPart.findOne({ where: { buildId: tern }, order: [['id', 'ASC']] }))!.id;
  ctx.ids.labourId = (await LabourEntry.findOne({ where: { buildId: tern }, order: [['id', 'ASC']] }))!.id;
  ctx.ids.expenseId = (await Expense.findOne({ where: { buildId: tern }, order: [['id', 'ASC']] }))!.id;

  // Records of their own for the DELETE rows, so deleting them disturbs no other row.
  const spare = await Upgrade.create({
    buildId: tern,
    title: 'Matrix spare upgrade',
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
  ctx.ids.spareUpgradeId = spare.id;
  ctx.ids.sparePartId = (
    await Part.create({
      buildId: tern,
      upgradeId: spare.id,
      partNumber: 'HT-MATRIX',
      description: 'Matrix spare part',
      retailPriceCents: null,
      supplier: null,
      productUrl: null,
      expectedArrival: null,
      orderedOn: null,
      receivedOn: null,
    })
  ).id;
  ctx.ids.spareRemovedPartId = (
    await RemovedPart.create({
      buildId: tern,
      upgradeId: null,
      description: 'Matrix spare',
      partNumber: null,
      expectedSaleCents: null,
      actualSaleCents: null,
      soldOn: null,
    })
  ).id;
  ctx.ids.spareLabourId = (
    await LabourEntry.create({
      buildId: tern,
      upgradeId: spare.id,
      userId: installer!.id,
      personName: installer!.name,
      workedOn: '2026-11-30',
      hours: 1,
      note: null,
    })
  ).id;
  ctx.ids.spareExpenseId = (
    await Expense.create({
      buildId: tern,
      upgradeId: null,
      description: 'Matrix spare',
      amountCents: 100,
      spentOn: '2026-11-30',
      category: null,
    })
  ).id;
  ctx.ids.spareBuildId = (
    await Build.create({
      slug: 'matrix-spare',
      name: 'Matrix spare build',
      year: 2020,
      make: 'Halvorsen',
      model: 'Skua',
      vin: null,
      mileage: null,
      budgetCents: null,
      labourRateCents: null,
      campaign: null,
      summary: null,
    })
  ).id;

  // The other build's own records, reached through the demo build's path for the IDOR checks.
  const ou = await Upgrade.create({
    buildId: other,
    title: 'Other build upgrade',
    area: 'front',
    replaces: null,
    becomes: null,
    installedOn: null,
    episodeId: null,
    episodePosition: null,
    notes: null,
    tireFrom: null,
    tireTo: null,
  });
  ctx.other.backlogUpgradeId = ou.id;
  ctx.other.backlogPartId = (
    await Part.create({
      buildId: other,
      upgradeId: ou.id,
      partNumber: 'HT-OTHER',
      description: 'Other build part',
      retailPriceCents: null,
      supplier: null,
      productUrl: null,
      expectedArrival: null,
      orderedOn: null,
      receivedOn: null,
    })
  ).id;
  ctx.other.backlogRemovedPartId = (
    await RemovedPart.create({
      buildId: other,
      upgradeId: ou.id,
      description: 'Other build removed',
      partNumber: null,
      expectedSaleCents: null,
      actualSaleCents: null,
      soldOn: null,
    })
  ).id;
  ctx.other.backlogLabourId = (
    await LabourEntry.create({
      buildId: other,
      upgradeId: ou.id,
      userId: installer!.id,
      personName: installer!.name,
      workedOn: '2026-11-30',
      hours: 1,
      note: null,
    })
  ).id;
  ctx.other.backlogExpenseId = (
    await Expense.create({
      buildId: other,
      upgradeId: ou.id,
      description: 'Other build expense',
      amountCents: 100,
      spentOn: '2026-11-30',
      category: null,
    })
  ).id;
}

const B = '/api/builds/:buildId';
const unknownBuild = (path: string) => (ctx: MatrixContext) =>
  path.replace(':buildId', String(Number(ctx.other.buildId) + 100000));
/** The other build's record named through the demo build's path. */
const otherRecord =
  (resource: string, key: string, suffix = '') =>
  (ctx: MatrixContext) =>
    `/api/builds/${ctx.ids.buildId}/${resource}/${ctx.other[key]}${suffix}`;
const spare = (resource: string, key: string) => (ctx: MatrixContext) =>
  `/api/builds/${ctx.ids.buildId}/${resource}/${ctx.ids[key]}`;

export const rows: MatrixRow[] = [
  // builds
  { method: 'GET', path: '/api/builds', allow: 'signed-in' },
  { method: 'POST', path: '/api/builds', allow: ['producer'], body: () => ({ slug: 'Not A Slug' }) },
  { method: 'GET', path: B, allow: 'signed-in', idor: unknownBuild(B) },
  { method: 'PATCH', path: B, allow: ['producer'], body: () => ({ version: 'x' }), idor: unknownBuild(B) },
  {
    method: 'DELETE',
    path: B,
    allow: ['owner'],
    url: (ctx) => `/api/builds/${ctx.ids.spareBuildId}`,
    idor: unknownBuild(B),
  },

  // upgrades
  { method: 'GET', path: `${B}/upgrades`, allow: 'signed-in', idor: unknownBuild(`${B}/upgrades`) },
  {
    method: 'POST',
    path: `${B}/upgrades`,
    allow: ['producer'],
    body: () => ({ title: '', area: 'moon' }),
    idor: unknownBuild(`${B}/upgrades`),
  },
  {
    method: 'POST',
    path: `${B}/upgrades/import`,
    allow: ['producer'],
    body: () => ({ not: 'csv' }),
    idor: unknownBuild(`${B}/upgrades/import`),
  },
  {
    method: 'GET',
    path: `${B}/upgrades/:upgradeId`,
    allow: 'signed-in',
    idor: otherRecord('upgrades', 'backlogUpgradeId'),
  },
  {
    method: 'PATCH',
    path: `${B}/upgrades/:upgradeId`,
    allow: ['producer', 'installer'],
    body: () => ({ version: 'x' }),
    idor: otherRecord('upgrades', 'backlogUpgradeId'),
  },
  {
    method: 'DELETE',
    path: `${B}/upgrades/:upgradeId`,
    allow: ['producer'],
    url: spare('upgrades', 'spareUpgradeId'),
    idor: otherRecord('upgrades', 'backlogUpgradeId'),
  },
  {
    method: 'PUT',
    path: `${B}/upgrades/:upgradeId/prerequisites`,
    allow: ['producer'],
    body: () => ({ prerequisiteIds: 'x' }),
    idor: otherRecord('upgrades', 'backlogUpgradeId', '/prerequisites'),
  },
  {
    method: 'GET',
    path: `${B}/upgrades/:upgradeId/activity`,
    allow: 'signed-in',
    idor: otherRecord('upgrades', 'backlogUpgradeId', '/activity'),
  },
  { method: 'GET', path: `${B}/upgrades.csv`, allow: ['producer'], idor: unknownBuild(`${B}/upgrades.csv`) },
  { method: 'GET', path: `${B}/parts.csv`, allow: ['producer'], idor: unknownBuild(`${B}/parts.csv`) },

  // parts
  { method: 'GET', path: `${B}/parts`, allow: 'signed-in', idor: unknownBuild(`${B}/parts`) },
  {
    method: 'POST',
    path: `${B}/parts`,
    allow: ['producer'],
    body: () => ({ quantity: -1 }),
    idor: unknownBuild(`${B}/parts`),
  },
  {
    method: 'POST',
    path: `${B}/parts/import`,
    allow: ['producer'],
    body: () => ({ not: 'csv' }),
    idor: unknownBuild(`${B}/parts/import`),
  },
  {
    method: 'PATCH',
    path: `${B}/parts/:partId`,
    allow: ['producer', 'marketing', 'installer'],
    body: () => ({ version: 'x' }),
    idor: otherRecord('parts', 'backlogPartId'),
  },
  {
    method: 'DELETE',
    path: `${B}/parts/:partId`,
    allow: ['producer'],
    url: spare('parts', 'sparePartId'),
    idor: otherRecord('parts', 'backlogPartId'),
  },

  // removed parts
  { method: 'GET', path: `${B}/removed-parts`, allow: 'signed-in', idor: unknownBuild(`${B}/removed-parts`) },
  {
    method: 'POST',
    path: `${B}/removed-parts`,
    allow: ['producer'],
    body: () => ({ description: '' }),
    idor: unknownBuild(`${B}/removed-parts`),
  },
  {
    method: 'PATCH',
    path: `${B}/removed-parts/:removedPartId`,
    allow: ['producer'],
    body: () => ({ disposition: 'lost' }),
    idor: otherRecord('removed-parts', 'backlogRemovedPartId'),
  },
  {
    method: 'DELETE',
    path: `${B}/removed-parts/:removedPartId`,
    allow: ['producer'],
    url: spare('removed-parts', 'spareRemovedPartId'),
    idor: otherRecord('removed-parts', 'backlogRemovedPartId'),
  },

  // labour
  { method: 'GET', path: `${B}/labour`, allow: 'signed-in', idor: unknownBuild(`${B}/labour`) },
  {
    method: 'POST',
    path: `${B}/labour`,
    allow: ['producer', 'installer'],
    body: () => ({ hours: -1 }),
    idor: unknownBuild(`${B}/labour`),
  },
  {
    method: 'PATCH',
    path: `${B}/labour/:labourId`,
    allow: ['producer', 'installer'],
    body: () => ({ hours: 25 }),
    idor: otherRecord('labour', 'backlogLabourId'),
  },
  {
    method: 'DELETE',
    path: `${B}/labour/:labourId`,
    allow: ['producer', 'installer'],
    url: spare('labour', 'spareLabourId'),
    idor: otherRecord('labour', 'backlogLabourId'),
  },

  // expenses
  { method: 'GET', path: `${B}/expenses`, allow: ['producer'], idor: unknownBuild(`${B}/expenses`) },
  {
    method: 'POST',
    path: `${B}/expenses`,
    allow: ['producer'],
    body: () => ({ amountCents: -5 }),
    idor: unknownBuild(`${B}/expenses`),
  },
  {
    method: 'PATCH',
    path: `${B}/expenses/:expenseId`,
    allow: ['producer'],
    body: () => ({ spentOn: '2026-13-01' }),
    idor: otherRecord('expenses', 'backlogExpenseId'),
  },
  {
    method: 'DELETE',
    path: `${B}/expenses/:expenseId`,
    allow: ['producer'],
    url: spare('expenses', 'spareExpenseId'),
    idor: otherRecord('expenses', 'backlogExpenseId'),
  },
];
