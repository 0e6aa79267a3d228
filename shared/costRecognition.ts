// When money becomes actual cost, the cash side of the same money, and the bottom-up estimate at
// completion. Parts enter actual cost when fitted (or their upgrade installed), or — by the build's
// choice — when received, so that actual cost and earned value describe the same work.
import { roundHalfUpCents } from './costs';
import type { InstallState, PartState } from './domain';

export const COST_RECOGNITIONS = ['fitting', 'receipt'] as const;
export type CostRecognition = (typeof COST_RECOGNITIONS)[number];
export const COST_RECOGNITION_LABELS: Record<CostRecognition, string> = {
  fitting: 'At fitting',
  receipt: 'At receipt',
};
export const COST_RECOGNITION_DESCRIPTIONS: Record<CostRecognition, string> = {
  fitting:
    'A part’s cost counts as actual cost when the part is fitted or its upgrade installed — when its earned value can be credited.',
  receipt: 'A part’s cost counts as actual cost when the part is received (or fitted, or its upgrade installed).',
};

export interface RecognitionInput {
  recognition: CostRecognition;
  /** Status date: money dated after it is not actual yet. */
  asOf: string;
  labourRateCents: number;
  upgrades: {
    id: number;
    estimatedHours: number;
    installState: InstallState;
    installedOn: string | null;
    done: boolean;
  }[];
  /** Part lines (or lines summed per upgrade, state and dates); returned parts left out. */
  parts: {
    upgradeId: number;
    state: PartState;
    cents: number;
    orderedOn: string | null;
    receivedOn: string | null;
    fittedOn: string | null;
  }[];
  labour: { upgradeId: number | null; workedOn: string; hours: number }[];
  expenses: { upgradeId: number | null; spentOn: string; cents: number }[];
  /** Sales of removed parts; an undated sale counts on the status date. */
  recoveries: { upgradeId: number | null; soldOn: string | null; cents: number }[];
}

export interface CashView {
  /** Labour worked, expenses spent and parts received or fitted, less sales, through the status date. */
  paidCents: number;
  /** Parts ordered (or backordered) and not received, plus money booked for a later date. */
  committedCents: number;
  /** Parts not yet ordered. */
  notOrderedCents: number;
  /** paid + committed + not ordered: the roll-up's net cost. */
  netCents: number;
}

export interface UpgradeEstimateToComplete {
  upgradeId: number;
  remainingHours: number;
  labourCents: number;
  /** Its parts not yet in actual cost. */
  partsCents: number;
  /** Its labour, expenses and sales dated after the status date. */
  plannedCents: number;
  etcCents: number;
}

export interface Recognition {
  recognition: CostRecognition;
  /** Recognition date of each input part line, in input order; null while not in actual cost. */
  partDates: (string | null)[];
  /** Actual cost (AC) through the status date. */
  actualCents: number;
  /** What is in the roll-up but not yet in actual cost: actual + the four = net. */
  pending: { receivedNotFittedCents: number; committedCents: number; notOrderedCents: number; laterDatedCents: number };
  cash: CashView;
  netCents: number;
  /** Bottom-up: AC + the estimate to complete of every upgrade (no hours left once it is installed). */
  forecast: {
    atCompletionCents: number;
    etcCents: number;
    remainingHours: number;
    remainingLabourCents: number;
    remainingPartsCents: number;
    plannedCents: number;
    upgrades: UpgradeEstimateToComplete[];
  };
}

const inHand = (s: PartState) => s === 'received' || s === 'fitted';
const earlier = (a: string | null, b: string | null) => (a === null ? b : b === null || a <= b ? a : b);

/** The day a part line enters actual cost under the rule, or null when it has not. */
export function partRecognisedOn(
  recognition: CostRecognition,
  p: RecognitionInput['parts'][number],
  upgrade: { installState: InstallState; installedOn: string | null } | undefined,
  asOf: string,
): string | null {
  const installed = upgrade?.installState === 'installed' ? (upgrade.installedOn ?? asOf) : null;
  if (recognition === 'fitting') {
    const fitted = p.state === 'fitted' ? (p.fittedOn ?? p.receivedOn ?? p.orderedOn ?? asOf) : null;
    return earlier(fitted, installed);
  }
  const received = inHand(p.state) ? (p.receivedOn ?? p.fittedOn ?? p.orderedOn ?? asOf) : null;
  return earlier(received, installed);
}

/**
 * Labour is costed per upgrade on its hours, rounded once, as the roll-up does; what is dated after
 * the status date is the difference between the whole and the part through it, so the sums agree to the cent.
 */
export function recogniseCosts(input: RecognitionInput): Recognition {
  const { asOf, labourRateCents: rate } = input;
  const upgrades = new Map(input.upgrades.map((u) => [u.id, u]));
  const key = (id: number | null) => (id !== null && upgrades.has(id) ? id : null);
  const planned = new Map<number | null, number>();
  const addPlanned = (id: number | null, c: number) => planned.set(key(id), (planned.get(key(id)) ?? 0) + c);

  const hoursAll = new Map<number | null, number>();
  const hoursNow = new Map<number | null, number>();
  for (const l of input.labour) {
    const k = key(l.upgradeId);
    hoursAll.set(k, (hoursAll.get(k) ?? 0) + l.hours);
    if (l.workedOn <= asOf) hoursNow.set(k, (hoursNow.get(k) ?? 0) + l.hours);
  }
  let labourNow = 0;
  let labourAll = 0;
  for (const [id, h] of hoursAll) {
    const all = roundHalfUpCents(h * rate);
    const now = roundHalfUpCents((hoursNow.get(id) ?? 0) * rate);
    labourAll += all;
    labourNow += now;
    if (all !== now) addPlanned(id, all - now);
  }

  let expensesNow = 0;
  let expensesAll = 0;
  for (const e of input.expenses) {
    expensesAll += e.cents;
    if (e.spentOn <= asOf) expensesNow += e.cents;
    else addPlanned(e.upgradeId, e.cents);
  }
  let recoveredNow = 0;
  let recoveredAll = 0;
  for (const r of input.recoveries) {
    recoveredAll += r.cents;
    if ((r.soldOn ?? asOf) <= asOf) recoveredNow += r.cents;
    else addPlanned(r.upgradeId, -r.cents);
  }

  const partDates: (string | null)[] = [];
  const pending = { receivedNotFittedCents: 0, committedCents: 0, notOrderedCents: 0, laterDatedCents: 0 };
  const cash = { paidCents: 0, committedCents: 0, notOrderedCents: 0, netCents: 0 };
  const partsLeft = new Map<number, number>();
  let partsNow = 0;
  let partsAll = 0;
  for (const p of input.parts) {
    partsAll += p.cents;
    const on = partRecognisedOn(input.recognition, p, upgrades.get(p.upgradeId), asOf);
    partDates.push(on);
    if (inHand(p.state)) cash.paidCents += p.cents;
    else if (p.state === 'to_order') cash.notOrderedCents += p.cents;
    else cash.committedCents += p.cents;
    if (on !== null && on <= asOf) {
      partsNow += p.cents;
      continue;
    }
    partsLeft.set(p.upgradeId, (partsLeft.get(p.upgradeId) ?? 0) + p.cents);
    if (inHand(p.state)) pending.receivedNotFittedCents += p.cents;
    else if (p.state === 'to_order') pending.notOrderedCents += p.cents;
    else pending.committedCents += p.cents;
  }

  const netCents = partsAll + labourAll + expensesAll - recoveredAll;
  const actualCents = partsNow + labourNow + expensesNow - recoveredNow;
  pending.laterDatedCents = labourAll - labourNow + (expensesAll - expensesNow) - (recoveredAll - recoveredNow);
  cash.paidCents += labourNow + expensesNow - recoveredNow;
  cash.committedCents += pending.laterDatedCents;
  cash.netCents = cash.paidCents + cash.committedCents + cash.notOrderedCents;

  const perUpgrade: UpgradeEstimateToComplete[] = input.upgrades.map((u) => {
    // An installed upgrade's shop work is done: only its filming is left, which costs no bay hours.
    const remainingHours =
      u.done || u.installState === 'installed'
        ? 0
        : Math.max(0, Math.round((u.estimatedHours - (hoursAll.get(u.id) ?? 0)) * 1e6) / 1e6);
    const labourCents = roundHalfUpCents(remainingHours * rate);
    const partsCents = partsLeft.get(u.id) ?? 0;
    const plannedCents = planned.get(u.id) ?? 0;
    return {
      upgradeId: u.id,
      remainingHours,
      labourCents,
      partsCents,
      plannedCents,
      etcCents: labourCents + partsCents + plannedCents,
    };
  });
  const sum = (k: keyof UpgradeEstimateToComplete) => perUpgrade.reduce((s, u) => s + u[k], 0);
  const unassignedPlanned = planned.get(null) ?? 0;
  let strayParts = 0; // parts of an id that is not an upgrade of the input: still work to pay for
  for (const [id, c] of partsLeft) if (!upgrades.has(id)) strayParts += c;
  const etcCents = sum('etcCents') + unassignedPlanned + strayParts;
  return {
    recognition: input.recognition,
    partDates,
    actualCents,
    pending,
    cash,
    netCents,
    forecast: {
      atCompletionCents: actualCents + etcCents,
      etcCents,
      remainingHours: Math.round(sum('remainingHours') * 1e6) / 1e6,
      remainingLabourCents: sum('labourCents'),
      remainingPartsCents: sum('partsCents') + strayParts,
      plannedCents: sum('plannedCents') + unassignedPlanned,
      upgrades: perUpgrade,
    },
  };
}
