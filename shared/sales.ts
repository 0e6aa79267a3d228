// Kit sales per episode (DESIGN §11 "Sales"): attribution of order lines to episodes, the figures per
// episode, per upgrade and for the series. Pure; cents. Return on the build and the payback date, with
// the definitions they follow, are shared/salesPayback.ts.
import { addDays } from './dates';
import { paybackOf, returnOnBuild, type DatedAmount, type Payback } from './salesPayback';
import { episodeNumberOf } from './salesTags';

export { episodeNumberOf, tagsOfUrl } from './salesTags';

export type Attribution = 'direct' | 'assisted' | 'unattributed';

export interface SaleLineInput {
  id: number;
  orderId: string;
  lineId: string | null;
  /** YYYY-MM-DD */
  soldOn: string;
  sku: string;
  /** Below zero on a refund. */
  quantity: number;
  /** The line's total (all units, after discounts), in cents; below zero on a refund. */
  revenueCents: number;
  campaign: string | null;
  content: string | null;
}

export interface SalesPartInput {
  id: number;
  upgradeId: number;
  partNumber: string;
  storeSku: string | null;
  unitCostCents: number;
}
export interface SalesUpgradeInput {
  id: number;
  title: string;
  episodeId: number | null;
}
export interface SalesEpisodeInput {
  id: number;
  number: number;
  title: string;
  state: string;
  releaseDate: string | null;
}

export interface AttributedLine extends SaleLineInput {
  attribution: Attribution;
  episodeId: number | null;
  partId: number | null;
  /** Why a line is unattributed (null for direct and assisted). */
  reason: string | null;
  refund: boolean;
  /** revenue − unit cost × units; null when the SKU matches no part (no cost known). */
  marginCents: number | null;
}

export const isRefund = (quantity: number, revenueCents: number) => quantity < 0 && revenueCents < 0;

/** Matching is on the trimmed, upper-cased code: "ht-fog-5120 " sells part HT-FOG-5120. */
export const skuKey = (s: string) => s.trim().toUpperCase();

export interface AttributionInput {
  /** The tag this build's links carry as utm_campaign (compared without regard to case). */
  campaignTag: string;
  /** Days after a release in which an untagged sale still counts as assisted (release day = day 0). */
  windowDays: number;
  lines: readonly SaleLineInput[];
  parts: readonly SalesPartInput[];
  upgrades: readonly SalesUpgradeInput[];
  episodes: readonly SalesEpisodeInput[];
}

/**
 * The attribution rule, as the Sales screen states it:
 * - direct: the SKU is a part of the build, utm_campaign is this build's tag and utm_content names
 *   one of its episodes ("episode-N");
 * - assisted: no campaign tag at all, and the SKU is a part shown in a live episode released on or
 *   before the sale and at most `windowDays` days before it; the latest such episode gets it;
 * - unattributed: everything else, with the reason.
 * A refund takes the attribution of the sale it refunds (same order and SKU) when that sale is
 * present, so it reduces the episode that was credited; otherwise it is judged on its own.
 */
export function attributeLines(input: AttributionInput): AttributedLine[] {
  const tag = input.campaignTag.trim().toLowerCase();
  const partsBySku = new Map<string, SalesPartInput[]>();
  for (const p of [...input.parts].sort((a, b) => a.id - b.id)) {
    for (const code of new Set(
      [p.storeSku, p.partNumber].filter((c): c is string => !!c && c.trim() !== '').map(skuKey),
    )) {
      partsBySku.set(code, [...(partsBySku.get(code) ?? []), p]);
    }
  }
  const upgradeEpisode = new Map(input.upgrades.map((u) => [u.id, u.episodeId]));
  const episodeById = new Map(input.episodes.map((e) => [e.id, e]));
  const episodeByNumber = new Map(input.episodes.map((e) => [e.number, e]));

  const judge = (
    line: SaleLineInput,
  ): Omit<AttributedLine, keyof SaleLineInput | 'refund' | 'marginCents'> & { part: SalesPartInput | null } => {
    const candidates = partsBySku.get(skuKey(line.sku)) ?? [];
    const campaign = line.campaign?.trim() || null;
    const none = (reason: string, part: SalesPartInput | null = candidates[0] ?? null) => ({
      attribution: 'unattributed' as const,
      episodeId: null,
      partId: part?.id ?? null,
      reason,
      part,
    });
    if (candidates.length === 0) return none('the SKU matches no part of this build', null);
    if (campaign) {
      if (campaign.toLowerCase() !== tag) return none(`tagged for another campaign ("${campaign}")`);
      const n = episodeNumberOf(line.content);
      const ep = n === null ? undefined : episodeByNumber.get(n);
      if (!ep)
        return none(
          line.content?.trim()
            ? `tagged for this build, but "${line.content.trim()}" names no episode of it`
            : 'tagged for this build, but no episode is named',
        );
      const part = candidates.find((p) => upgradeEpisode.get(p.upgradeId) === ep.id) ?? candidates[0]!;
      return { attribution: 'direct', episodeId: ep.id, partId: part.id, reason: null, part };
    }
    if (line.content?.trim()) return none('has utm_content but no utm_campaign');
    let best: { ep: SalesEpisodeInput; part: SalesPartInput } | null = null;
    for (const part of candidates) {
      const epId = upgradeEpisode.get(part.upgradeId);
      const ep = epId == null ? undefined : episodeById.get(epId);
      if (!ep || ep.state !== 'live' || !ep.releaseDate) continue;
      if (ep.releaseDate > line.soldOn || addDays(ep.releaseDate, input.windowDays) < line.soldOn) continue;
      if (
        !best ||
        ep.releaseDate > best.ep.releaseDate! ||
        (ep.releaseDate === best.ep.releaseDate && ep.number > best.ep.number)
      )
        best = { ep, part };
    }
    if (best)
      return { attribution: 'assisted', episodeId: best.ep.id, partId: best.part.id, reason: null, part: best.part };
    return none(`untagged, and sold outside ${input.windowDays} days after every live episode showing the part`);
  };

  const out: AttributedLine[] = [];
  const saleOf = new Map<string, ReturnType<typeof judge>>();
  const key = (l: SaleLineInput) => `${l.orderId}\u0000${skuKey(l.sku)}`;
  const ordered = [...input.lines].sort((a, b) => (a.soldOn < b.soldOn ? -1 : a.soldOn > b.soldOn ? 1 : a.id - b.id));
  for (const l of ordered) {
    const refund = isRefund(l.quantity, l.revenueCents);
    let j: ReturnType<typeof judge>;
    if (refund && saleOf.has(key(l))) j = saleOf.get(key(l))!;
    else {
      j = judge(l);
      if (!refund && !saleOf.has(key(l))) saleOf.set(key(l), j);
    }
    const { part, ...rest } = j;
    out.push({
      ...l,
      ...rest,
      refund,
      marginCents: part ? lineMargin(l.revenueCents, part.unitCostCents, l.quantity) : null,
    });
  }
  return out;
}

/** Margin of one line: revenue − unit cost × units. A refund (both below zero) gives it back. */
export function lineMargin(revenueCents: number, unitCostCents: number, quantity: number): number {
  return revenueCents - unitCostCents * quantity;
}

export interface Figures {
  orders: number;
  units: number;
  revenueCents: number;
  marginCents: number;
}

/** Orders are counted once per order id among sale lines (refunds do not add an order). */
export function figuresOf(lines: readonly AttributedLine[]): Figures {
  const orders = new Set<string>();
  let units = 0;
  let revenueCents = 0;
  let marginCents = 0;
  for (const l of lines) {
    if (!l.refund) orders.add(l.orderId);
    units += l.quantity;
    revenueCents += l.revenueCents;
    marginCents += l.marginCents ?? 0;
  }
  return { orders: orders.size, units, revenueCents, marginCents };
}

export interface EpisodeSales {
  episodeId: number;
  number: number;
  title: string;
  state: string;
  releaseDate: string | null;
  direct: Figures;
  assisted: Figures;
}
export interface UpgradeSales {
  upgradeId: number;
  title: string;
  episodeId: number | null;
  episodeNumber: number | null;
  releaseDate: string | null;
  /** Every matched line of the upgrade's parts dated on or after its episode's release, whatever its attribution. */
  sinceRelease: Figures;
}
export interface SeriesSales {
  direct: Figures;
  assisted: Figures;
  unattributed: Figures;
  /** Direct + assisted: what the series is credited with (unattributed lines are listed, not counted). */
  revenueCents: number;
  marginCents: number;
  netCostCents: number;
  returnOnBuild: number | null;
  paybackDate: string | null;
  marginNeededCents: number;
}

export interface SalesFigures {
  lines: AttributedLine[];
  episodes: EpisodeSales[];
  upgrades: UpgradeSales[];
  series: SeriesSales;
  payback: Payback;
}

/** Every figure of the Sales screen from attributed lines and the build's net cost by day. */
export function salesFigures(
  input: AttributionInput & { netCostCents: number; netCostByDay: readonly DatedAmount[] },
): SalesFigures {
  const lines = attributeLines(input);
  const byKind = (k: Attribution) => lines.filter((l) => l.attribution === k);
  const episodes = [...input.episodes]
    .sort((a, b) => a.number - b.number)
    .map((e) => ({
      episodeId: e.id,
      number: e.number,
      title: e.title,
      state: e.state,
      releaseDate: e.releaseDate,
      direct: figuresOf(lines.filter((l) => l.attribution === 'direct' && l.episodeId === e.id)),
      assisted: figuresOf(lines.filter((l) => l.attribution === 'assisted' && l.episodeId === e.id)),
    }));
  const partUpgrade = new Map(input.parts.map((p) => [p.id, p.upgradeId]));
  const episodeById = new Map(input.episodes.map((e) => [e.id, e]));
  const linesOfUpgrade = new Map<number, AttributedLine[]>();
  for (const l of lines) {
    const u = l.partId === null ? undefined : partUpgrade.get(l.partId);
    if (u === undefined) continue;
    const list = linesOfUpgrade.get(u);
    if (list) list.push(l);
    else linesOfUpgrade.set(u, [l]);
  }
  const upgrades = input.upgrades.map((u) => {
    const ep = u.episodeId == null ? undefined : episodeById.get(u.episodeId);
    const release = ep?.releaseDate ?? null;
    const mine = release === null ? [] : (linesOfUpgrade.get(u.id) ?? []).filter((l) => l.soldOn >= release);
    return {
      upgradeId: u.id,
      title: u.title,
      episodeId: u.episodeId,
      episodeNumber: ep?.number ?? null,
      releaseDate: release,
      sinceRelease: figuresOf(mine),
    };
  });
  const direct = figuresOf(byKind('direct'));
  const assisted = figuresOf(byKind('assisted'));
  const credited = lines.filter((l) => l.attribution !== 'unattributed');
  const payback = paybackOf(
    credited.map((l) => ({ date: l.soldOn, cents: l.marginCents ?? 0 })),
    input.netCostByDay,
  );
  const marginCents = direct.marginCents + assisted.marginCents;
  return {
    lines,
    episodes,
    upgrades,
    payback,
    series: {
      direct,
      assisted,
      unattributed: figuresOf(byKind('unattributed')),
      revenueCents: direct.revenueCents + assisted.revenueCents,
      marginCents,
      netCostCents: input.netCostCents,
      returnOnBuild: returnOnBuild(marginCents, input.netCostCents),
      paybackDate: payback.paybackDate,
      marginNeededCents: payback.paybackDate ? 0 : Math.max(0, input.netCostCents - marginCents),
    },
  };
}

// The answers built from these figures (the Sales screen's summary, its line pages) are contracts:
// shared/contracts/sales.ts, one shape per role.
