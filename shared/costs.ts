// Cost roll-up (DESIGN §4.1): parts, labour, expenses and recoveries per upgrade, area, episode and build.
import { AREAS, type Area, type Disposition, type PartState } from './domain';

export interface CostInput {
  labourRateCents: number;
  upgrades: { id: number; area: Area; episodeId: number | null; estimatedHours: number; valueAddedCents: number }[];
  parts: { upgradeId: number; quantity: number; unitCostCents: number; state: PartState }[];
  labour: { upgradeId: number; hours: number }[];
  expenses: { upgradeId: number | null; amountCents: number }[];
  removedParts: {
    upgradeId: number | null;
    disposition: Disposition;
    expectedSaleCents: number | null;
    actualSaleCents: number | null;
  }[];
}

export interface CostRow {
  partsCents: number;
  labourCents: number;
  expensesCents: number;
  /** Sold removed parts at their actual sale price. */
  recoveredCents: number;
  /** Removed parts still for sale, at their expected price: shown beside net cost, never subtracted. */
  expectedRecoveryCents: number;
  /** parts + labour + expenses − recovered. */
  netCents: number;
  estimatedHours: number;
  actualHours: number;
  valueAddedCents: number;
  /** Value added per dollar of net cost; null when net cost is zero or negative. */
  valuePerDollar: number | null;
}

export interface CostRollup {
  upgrades: (CostRow & { upgradeId: number })[];
  /** Areas in AREAS order (then any others alphabetically), only those with upgrades. */
  areas: (CostRow & { area: Area })[];
  /** Episodes by id ascending; upgrades in no episode are the row with episodeId null, last. */
  episodes: (CostRow & { episodeId: number | null })[];
  /** Money on no upgrade (or on an id that is not an upgrade of the build): counted in build only. */
  unassigned: CostRow;
  /** Build totals: the sum of the upgrade rows plus the unassigned bucket, to the cent. */
  build: CostRow;
}

/**
 * Rounds an amount of cents to a whole cent, halves away from zero: 0.5 → 1, 2.5 → 3, −0.5 → −1
 * (for the non-negative amounts of normal use this is plain half-up). The value is first snapped to
 * six decimals so float products such as 0.47 h × 8,550 ¢ = 4018.4999999999995 round as the decimal
 * arithmetic a person would do (4,018.5 → 4,019 ¢), not one cent short.
 */
export function roundHalfUpCents(x: number): number {
  const snapped = Math.round(x * 1e6) / 1e6;
  const r = Math.sign(snapped) * Math.floor(Math.abs(snapped) + 0.5);
  return r === 0 ? 0 : r; // no −0
}

const hours6 = (h: number) => Math.round(h * 1e6) / 1e6;

interface Acc {
  parts: number;
  labourHours: number;
  labourCents: number;
  expenses: number;
  recovered: number;
  expected: number;
  estimatedHours: number;
  valueAdded: number;
}
const emptyAcc = (): Acc => ({
  parts: 0,
  labourHours: 0,
  labourCents: 0,
  expenses: 0,
  recovered: 0,
  expected: 0,
  estimatedHours: 0,
  valueAdded: 0,
});

function toRow(a: Acc): CostRow {
  const netCents = a.parts + a.labourCents + a.expenses - a.recovered;
  return {
    partsCents: a.parts,
    labourCents: a.labourCents,
    expensesCents: a.expenses,
    recoveredCents: a.recovered,
    expectedRecoveryCents: a.expected,
    netCents,
    estimatedHours: hours6(a.estimatedHours),
    actualHours: hours6(a.labourHours),
    valueAddedCents: a.valueAdded,
    valuePerDollar: netCents > 0 ? a.valueAdded / netCents : null,
  };
}

function addInto(into: Acc, a: Acc): void {
  into.parts += a.parts;
  into.labourHours += a.labourHours;
  into.labourCents += a.labourCents;
  into.expenses += a.expenses;
  into.recovered += a.recovered;
  into.expected += a.expected;
  into.estimatedHours += a.estimatedHours;
  into.valueAdded += a.valueAdded;
}

/**
 * Labour is costed per upgrade: its hours are summed, multiplied by the rate and rounded once
 * (roundHalfUpCents), so an upgrade's labour is what its own hours cost and every higher level is a
 * plain sum of upgrade rows. Each part line is quantity × unit cost, rounded the same way should a
 * quantity be fractional. Returned parts cost nothing; a sold removed part recovers its actual sale
 * price (none recorded: 0); a part for sale counts only as expected recovery.
 */
export function rollUpCosts(input: CostInput): CostRollup {
  const rate = input.labourRateCents;
  const byUpgrade = new Map<number, Acc>();
  for (const u of input.upgrades) {
    if (byUpgrade.has(u.id)) continue;
    const a = emptyAcc();
    a.estimatedHours = u.estimatedHours;
    a.valueAdded = u.valueAddedCents ?? 0;
    byUpgrade.set(u.id, a);
  }
  const unassigned = emptyAcc();
  const accOf = (id: number | null) => (id == null ? unassigned : (byUpgrade.get(id) ?? unassigned));

  for (const p of input.parts) {
    if (p.state === 'returned') continue;
    accOf(p.upgradeId).parts += roundHalfUpCents(p.quantity * p.unitCostCents);
  }
  for (const l of input.labour) accOf(l.upgradeId).labourHours += l.hours;
  for (const e of input.expenses) accOf(e.upgradeId).expenses += e.amountCents;
  for (const r of input.removedParts) {
    const a = accOf(r.upgradeId);
    if (r.disposition === 'sold') a.recovered += r.actualSaleCents ?? 0;
    else if (r.disposition === 'for_sale') a.expected += r.expectedSaleCents ?? 0;
  }
  for (const a of byUpgrade.values()) a.labourCents = roundHalfUpCents(a.labourHours * rate);
  unassigned.labourCents = roundHalfUpCents(unassigned.labourHours * rate);

  const areaAcc = new Map<Area, Acc>();
  const episodeAcc = new Map<number | null, Acc>();
  const build = emptyAcc();
  const upgrades: CostRollup['upgrades'] = [];
  const seen = new Set<number>();
  for (const u of input.upgrades) {
    if (seen.has(u.id)) continue;
    seen.add(u.id);
    const a = byUpgrade.get(u.id)!;
    upgrades.push({ upgradeId: u.id, ...toRow(a) });
    if (!areaAcc.has(u.area)) areaAcc.set(u.area, emptyAcc());
    addInto(areaAcc.get(u.area)!, a);
    const ep = u.episodeId ?? null;
    if (!episodeAcc.has(ep)) episodeAcc.set(ep, emptyAcc());
    addInto(episodeAcc.get(ep)!, a);
    addInto(build, a);
  }
  addInto(build, unassigned);

  const areaOrder = (a: Area) => {
    const i = (AREAS as readonly string[]).indexOf(a);
    return i < 0 ? AREAS.length : i;
  };
  const areas = [...areaAcc.entries()]
    .sort(([a], [b]) => areaOrder(a) - areaOrder(b) || a.localeCompare(b))
    .map(([area, a]) => ({ area, ...toRow(a) }));
  const episodes = [...episodeAcc.entries()]
    .sort(([a], [b]) => (a === null ? 1 : b === null ? -1 : a - b))
    .map(([episodeId, a]) => ({ episodeId, ...toRow(a) }));
  return { upgrades, areas, episodes, unassigned: toRow(unassigned), build: toRow(build) };
}
