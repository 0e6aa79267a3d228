// shared/sales.ts and shared/salesPayback.ts: attribution, margin, return on the build and payback,
// on small cases worked out by hand below each one. Definitions: return on investment = (gain − cost) ÷ cost (the usual textbook
// form, e.g. Wikipedia "Return on investment"); simple payback = the period until cumulative net
// inflows have paid back the investment (Association of Corporate Treasurers glossary, "Payback period").
import { describe, it, expect } from 'vitest';
import {
  attributeLines,
  episodeNumberOf,
  lineMargin,
  salesFigures,
  tagsOfUrl,
  type AttributionInput,
  type SaleLineInput,
} from '../../shared/sales';
import { netCostByDay, paybackOf, returnOnBuild } from '../../shared/salesPayback';

// A build with two live episodes and one draft:
//   episode 1 (id 11) released 2026-10-01 shows upgrade 101 (part 1001 "HT-A", cost $100.00)
//   episode 2 (id 12) released 2026-10-20 shows upgrade 102 (part 1002 "HT-B", store SKU "STORE-B", cost $40.00)
//                                          and upgrade 103 (part 1003, also "HT-A" — the same kit shown again, cost $100.00)
//   episode 3 (id 13) draft, no release, shows upgrade 104 (part 1004 "HT-C", cost $10.00)
const base: Omit<AttributionInput, 'lines'> = {
  campaignTag: 'project-tern',
  windowDays: 30,
  parts: [
    { id: 1001, upgradeId: 101, partNumber: 'HT-A', storeSku: null, unitCostCents: 10_000 },
    { id: 1002, upgradeId: 102, partNumber: 'HT-B', storeSku: 'STORE-B', unitCostCents: 4_000 },
    { id: 1003, upgradeId: 103, partNumber: 'HT-A', storeSku: null, unitCostCents: 10_000 },
    { id: 1004, upgradeId: 104, partNumber: 'HT-C', storeSku: null, unitCostCents: 1_000 },
  ],
  upgrades: [
    { id: 101, title: 'Kit A', episodeId: 11 },
    { id: 102, title: 'Kit B', episodeId: 12 },
    { id: 103, title: 'Kit A again', episodeId: 12 },
    { id: 104, title: 'Kit C', episodeId: 13 },
  ],
  episodes: [
    { id: 11, number: 1, title: 'One', state: 'live', releaseDate: '2026-10-01' },
    { id: 12, number: 2, title: 'Two', state: 'live', releaseDate: '2026-10-20' },
    { id: 13, number: 3, title: 'Three', state: 'draft', releaseDate: null },
  ],
};
let nextId = 1;
const line = (
  l: Partial<SaleLineInput> & Pick<SaleLineInput, 'soldOn' | 'sku' | 'quantity' | 'revenueCents'>,
): SaleLineInput => ({
  id: nextId++,
  orderId: `O-${nextId}`,
  lineId: null,
  campaign: null,
  content: null,
  ...l,
});

describe('tags and episode names', () => {
  it('reads utm_campaign and utm_content from an absolute address or a path', () => {
    expect(
      tagsOfUrl('https://shop.example/p/ht-a?utm_source=youtube&utm_campaign=project-tern&utm_content=episode-2'),
    ).toEqual({ campaign: 'project-tern', content: 'episode-2' });
    expect(tagsOfUrl('/p/ht-a?utm_campaign=project-tern')).toEqual({ campaign: 'project-tern', content: null });
    expect(tagsOfUrl('')).toEqual({ campaign: null, content: null });
  });
  it('names an episode only as episode-N', () => {
    expect(episodeNumberOf('episode-12')).toBe(12);
    expect(episodeNumberOf('EPISODE-3')).toBe(3);
    expect(episodeNumberOf('ep3')).toBeNull();
    expect(episodeNumberOf(null)).toBeNull();
  });
});

describe('attribution', () => {
  it('a tagged line naming an episode is direct to it, whatever the date', () => {
    const [l] = attributeLines({
      ...base,
      lines: [
        line({
          soldOn: '2026-12-31',
          sku: 'ht-a ',
          quantity: 1,
          revenueCents: 19_900,
          campaign: 'Project-Tern',
          content: 'episode-1',
        }),
      ],
    });
    expect(l).toMatchObject({ attribution: 'direct', episodeId: 11, partId: 1001, reason: null });
    // 199.00 − 100.00 × 1 = 99.00
    expect(l!.marginCents).toBe(9_900);
  });

  it('an untagged line goes to the latest live episode that showed the part within the window', () => {
    const lines = attributeLines({
      ...base,
      lines: [
        line({ soldOn: '2026-10-05', sku: 'HT-A', quantity: 1, revenueCents: 19_900 }), // only ep 1 released → ep 1
        line({ soldOn: '2026-10-25', sku: 'HT-A', quantity: 1, revenueCents: 19_900 }), // ep 1 (day 24) and ep 2 (day 5) → latest: ep 2
        line({ soldOn: '2026-10-31', sku: 'HT-A', quantity: 1, revenueCents: 19_900 }), // ep 1 day 30 (last day of the window) and ep 2 → ep 2
        line({ soldOn: '2026-09-30', sku: 'HT-A', quantity: 1, revenueCents: 19_900 }), // before any release → unattributed
        line({ soldOn: '2026-11-19', sku: 'HT-A', quantity: 1, revenueCents: 19_900 }), // ep 2 day 30 → ep 2
        line({ soldOn: '2026-11-20', sku: 'HT-A', quantity: 1, revenueCents: 19_900 }), // ep 2 day 31 → unattributed
        line({ soldOn: '2026-10-21', sku: 'STORE-B', quantity: 2, revenueCents: 15_000 }), // the store SKU of part 1002 → ep 2
        line({ soldOn: '2026-10-21', sku: 'HT-C', quantity: 1, revenueCents: 2_500 }), // shown only in a draft → unattributed
        line({ soldOn: '2026-10-21', sku: 'NOT-OURS', quantity: 1, revenueCents: 2_500 }), // no part → unattributed
      ],
    });
    expect(lines.map((l) => [l.soldOn, l.sku, l.attribution, l.episodeId])).toEqual([
      ['2026-09-30', 'HT-A', 'unattributed', null],
      ['2026-10-05', 'HT-A', 'assisted', 11],
      ['2026-10-21', 'STORE-B', 'assisted', 12],
      ['2026-10-21', 'HT-C', 'unattributed', null],
      ['2026-10-21', 'NOT-OURS', 'unattributed', null],
      ['2026-10-25', 'HT-A', 'assisted', 12],
      ['2026-10-31', 'HT-A', 'assisted', 12],
      ['2026-11-19', 'HT-A', 'assisted', 12],
      ['2026-11-20', 'HT-A', 'unattributed', null],
    ]);
    expect(lines.find((l) => l.sku === 'NOT-OURS')!.reason).toBe('the SKU matches no part of this build');
    expect(lines.find((l) => l.sku === 'NOT-OURS')!.marginCents).toBeNull();
    // 2 × part 1002: 150.00 − 40.00 × 2 = 70.00
    expect(lines.find((l) => l.sku === 'STORE-B')!.marginCents).toBe(7_000);
  });

  it('another campaign, an unknown episode or content without campaign is unattributed with its reason', () => {
    const lines = attributeLines({
      ...base,
      lines: [
        line({
          soldOn: '2026-10-02',
          sku: 'HT-A',
          quantity: 1,
          revenueCents: 100,
          campaign: 'winter-sale',
          content: 'episode-1',
        }),
        line({
          soldOn: '2026-10-03',
          sku: 'HT-A',
          quantity: 1,
          revenueCents: 100,
          campaign: 'project-tern',
          content: 'episode-9',
        }),
        line({ soldOn: '2026-10-04', sku: 'HT-A', quantity: 1, revenueCents: 100, content: 'episode-1' }),
      ],
    });
    expect(lines.map((l) => l.attribution)).toEqual(['unattributed', 'unattributed', 'unattributed']);
    expect(lines.map((l) => l.reason)).toEqual([
      'tagged for another campaign ("winter-sale")',
      'tagged for this build, but "episode-9" names no episode of it',
      'has utm_content but no utm_campaign',
    ]);
  });

  it('a refund takes the attribution of the sale it refunds and takes its margin back', () => {
    const lines = attributeLines({
      ...base,
      lines: [
        line({
          orderId: 'R-1',
          soldOn: '2026-10-05',
          sku: 'HT-A',
          quantity: 2,
          revenueCents: 39_800,
          campaign: 'project-tern',
          content: 'episode-1',
        }),
        // Refunded after the window, without tags: still direct to episode 1, because its sale was.
        line({ orderId: 'R-1', soldOn: '2026-12-20', sku: 'HT-A', quantity: -1, revenueCents: -19_900 }),
      ],
    });
    expect(lines.map((l) => [l.attribution, l.episodeId, l.refund])).toEqual([
      ['direct', 11, false],
      ['direct', 11, true],
    ]);
    // Sale: 398.00 − 100.00 × 2 = 198.00; refund: −199.00 − 100.00 × (−1) = −99.00; together 99.00.
    expect(lines.map((l) => l.marginCents)).toEqual([19_800, -9_900]);
  });
});

describe('margin, return and payback', () => {
  it('margin is revenue − unit cost × units', () => {
    expect(lineMargin(19_900, 10_000, 1)).toBe(9_900);
    expect(lineMargin(30_000, 4_000, 3)).toBe(18_000); // 300.00 − 40.00 × 3
    expect(lineMargin(-19_900, 10_000, -1)).toBe(-9_900);
  });

  it('return on the build is (margin − net cost) ÷ net cost, null without a positive net cost', () => {
    expect(returnOnBuild(150_000, 100_000)).toBe(0.5); // (1,500 − 1,000) ÷ 1,000
    expect(returnOnBuild(25_000, 100_000)).toBe(-0.75); // (250 − 1,000) ÷ 1,000
    expect(returnOnBuild(100_000, 100_000)).toBe(0);
    expect(returnOnBuild(5_000, 0)).toBeNull();
    expect(returnOnBuild(5_000, -200)).toBeNull();
  });

  it('payback is the first day cumulative margin reaches cumulative net cost', () => {
    // Cost: 1,000.00 on 10-01 and 500.00 more on 10-10 (1,500.00 in all).
    // Margin: 600 on 10-05, 600 on 10-12 (1,200 < 1,500), 300 on 10-15 (1,500 = 1,500 → paid back).
    const p = paybackOf(
      [
        { date: '2026-10-05', cents: 60_000 },
        { date: '2026-10-12', cents: 60_000 },
        { date: '2026-10-15', cents: 30_000 },
      ],
      [
        { date: '2026-10-01', cents: 100_000 },
        { date: '2026-10-10', cents: 50_000 },
      ],
    );
    expect(p.paybackDate).toBe('2026-10-15');
    expect(p.marginNeededCents).toBe(0);
    expect(p.points).toEqual([
      { date: '2026-10-01', cumulativeMarginCents: 0, cumulativeNetCostCents: 100_000 },
      { date: '2026-10-05', cumulativeMarginCents: 60_000, cumulativeNetCostCents: 100_000 },
      { date: '2026-10-10', cumulativeMarginCents: 60_000, cumulativeNetCostCents: 150_000 },
      { date: '2026-10-12', cumulativeMarginCents: 120_000, cumulativeNetCostCents: 150_000 },
      { date: '2026-10-15', cumulativeMarginCents: 150_000, cumulativeNetCostCents: 150_000 },
    ]);
  });

  it('not paid back: the margin still needed; caught up once but the build then cost more: not paid back', () => {
    const short = paybackOf([{ date: '2026-10-05', cents: 40_000 }], [{ date: '2026-10-01', cents: 100_000 }]);
    expect(short.paybackDate).toBeNull();
    expect(short.marginNeededCents).toBe(60_000); // 1,000 − 400

    // Margin 1,000 reaches cost 1,000 on 10-05; on 10-09 the build spends 300 more (1,300 > 1,000).
    const overtaken = paybackOf(
      [{ date: '2026-10-05', cents: 100_000 }],
      [
        { date: '2026-10-01', cents: 100_000 },
        { date: '2026-10-09', cents: 30_000 },
      ],
    );
    expect(overtaken.paybackDate).toBeNull();
    expect(overtaken.marginNeededCents).toBe(30_000);

    // Nothing spent: nothing to pay back, so no date either.
    expect(paybackOf([{ date: '2026-10-05', cents: 5_000 }], [])).toMatchObject({
      paybackDate: null,
      marginNeededCents: 0,
    });
  });

  it('net cost by day follows the cost roll-up and ends at its total', () => {
    // Rate 50.00/h. 10-01: part 2 × 30.00 = 60.00; 10-02: 1.5 h × 50.00 = 75.00; 10-03: expense 20.00;
    // 10-04: a removed part sold for 15.00; an unordered part of 10.00 falls on the status date 10-09.
    // Running net: 60.00, 135.00, 155.00, 140.00, 150.00.
    const days = netCostByDay({
      labourRateCents: 5_000,
      asOf: '2026-10-09',
      upgrades: [{ id: 1, area: 'front', episodeId: null, estimatedHours: 2, valueAddedCents: 0 }],
      parts: [
        { upgradeId: 1, quantity: 2, unitCostCents: 3_000, state: 'ordered', spentOn: '2026-10-01' },
        { upgradeId: 1, quantity: 1, unitCostCents: 1_000, state: 'to_order', spentOn: null },
      ],
      labour: [{ upgradeId: 1, hours: 1.5, workedOn: '2026-10-02' }],
      expenses: [{ upgradeId: null, amountCents: 2_000, spentOn: '2026-10-03' }],
      removedParts: [
        { upgradeId: 1, disposition: 'sold', expectedSaleCents: null, actualSaleCents: 1_500, soldOn: '2026-10-04' },
      ],
    });
    expect(days).toEqual([
      { date: '2026-10-01', cents: 6_000 },
      { date: '2026-10-02', cents: 7_500 },
      { date: '2026-10-03', cents: 2_000 },
      { date: '2026-10-04', cents: -1_500 },
      { date: '2026-10-09', cents: 1_000 },
    ]);
    expect(days.reduce((s, d) => s + d.cents, 0)).toBe(15_000);
  });
});

describe('figures per episode, upgrade and series', () => {
  it('adds up direct and assisted apart, counts unattributed separately, and the upgrades since release', () => {
    const f = salesFigures({
      ...base,
      netCostCents: 50_000,
      netCostByDay: [{ date: '2026-09-20', cents: 50_000 }],
      lines: [
        // Direct to ep 1: order D1, 2 × HT-A for 398.00 (margin 198.00).
        line({
          orderId: 'D1',
          soldOn: '2026-10-02',
          sku: 'HT-A',
          quantity: 2,
          revenueCents: 39_800,
          campaign: 'project-tern',
          content: 'episode-1',
        }),
        // Assisted to ep 2: order A1, 1 × STORE-B for 75.00 (margin 35.00) and 1 × HT-A for 199.00 (margin 99.00).
        line({ orderId: 'A1', soldOn: '2026-10-22', sku: 'STORE-B', quantity: 1, revenueCents: 7_500 }),
        line({ orderId: 'A1', soldOn: '2026-10-22', sku: 'HT-A', quantity: 1, revenueCents: 19_900 }),
        // Refund of one unit of D1: −199.00 (margin −99.00), direct to ep 1.
        line({ orderId: 'D1', soldOn: '2026-10-23', sku: 'HT-A', quantity: -1, revenueCents: -19_900 }),
        // Unattributed: 1 × NOT-OURS for 25.00.
        line({ orderId: 'U1', soldOn: '2026-10-23', sku: 'NOT-OURS', quantity: 1, revenueCents: 2_500 }),
      ],
    });
    const [one, two, three] = f.episodes;
    // Ep 1 direct: 1 order, 2 − 1 = 1 unit, 398 − 199 = 199.00 revenue, 198 − 99 = 99.00 margin.
    expect(one!.direct).toEqual({ orders: 1, units: 1, revenueCents: 19_900, marginCents: 9_900 });
    expect(one!.assisted).toEqual({ orders: 0, units: 0, revenueCents: 0, marginCents: 0 });
    // Ep 2 assisted: 1 order, 2 units, 75 + 199 = 274.00, 35 + 99 = 134.00.
    expect(two!.assisted).toEqual({ orders: 1, units: 2, revenueCents: 27_400, marginCents: 13_400 });
    expect(three!.direct.orders + three!.assisted.orders).toBe(0);
    // Series: revenue 199 + 274 = 473.00, margin 99 + 134 = 233.00; net cost 500.00.
    expect(f.series.revenueCents).toBe(47_300);
    expect(f.series.marginCents).toBe(23_300);
    expect(f.series.unattributed).toEqual({ orders: 1, units: 1, revenueCents: 2_500, marginCents: 0 });
    // (233 − 500) ÷ 500 = −0.534
    expect(f.series.returnOnBuild).toBeCloseTo(-0.534, 10);
    expect(f.series.paybackDate).toBeNull();
    expect(f.series.marginNeededCents).toBe(26_700); // 500 − 233
    // Upgrade 101 (ep 1, released 10-01): its part 1001 sold D1 (2), refund (−1) → 1 unit.
    // Upgrade 103 shares the code HT-A; assisted line A1 went to part 1003 (shown in ep 2) → 1 unit since 10-20.
    const byId = new Map(f.upgrades.map((u) => [u.upgradeId, u]));
    expect(byId.get(101)!.sinceRelease.units).toBe(1);
    expect(byId.get(103)!.sinceRelease.units).toBe(1);
    expect(byId.get(102)!.sinceRelease).toEqual({ orders: 1, units: 1, revenueCents: 7_500, marginCents: 3_500 });
    expect(byId.get(104)!.releaseDate).toBeNull();
  });
});
