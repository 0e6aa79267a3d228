// Sales import and figures (routes/sales.ts): the mapping step, the dry-run preview, all-or-nothing
// writes, idempotent re-imports, refunds, attribution and the owner-only cost figures. Every refused
// file is checked to have written nothing (row counts before and after).
import { describe, it, expect, beforeAll } from 'vitest';
import fs from 'node:fs';
import { agentsByRole, anonymous } from '../helpers/api';
import { counts, count } from '../helpers/db';
import { Build, Episode, Part, Upgrade } from '../../server/models';
import { TERN_SALES_FILE, TERN_SALES_MAPPING } from '../../server/db/seeders/0006-project-tern-sales';
import { everyAnswerHasAContract } from '../helpers/contract';

// Every JSON answer these tests read is parsed with its route's contract (shared/contracts).
everyAnswerHasAContract();

let as: Awaited<ReturnType<typeof agentsByRole>>;
let tern: Build;
const TABLES = ['sale_lines', 'sale_imports', 'sales_mappings', 'activities'];

// A small build of our own: campaign "kit-test", labour rate 0, one live episode (released
// 2026-10-01) showing upgrade "Kit A" with part HT-A (cost 100.00, bought 2026-09-20), one draft.
async function smallBuild(slug: string) {
  const res = await as.owner.post('/api/builds').send({
    slug,
    name: slug,
    year: 2020,
    make: 'Halvorsen',
    model: 'Tern',
    campaign: 'kit-test',
    labourRateCents: 0,
    budgetCents: 100_000,
  });
  expect(res.status).toBe(201);
  const buildId = res.body.build.id as number;
  const ep1 = await Episode.create({
    buildId,
    number: 1,
    title: 'One',
    state: 'live',
    releaseDate: '2026-10-01',
    shootDate: '2026-09-25',
    summary: null,
    videoUrl: null,
    runtimeSeconds: null,
    publishedAt: null,
  });
  await Episode.create({
    buildId,
    number: 2,
    title: 'Two',
    state: 'draft',
    releaseDate: null,
    shootDate: null,
    summary: null,
    videoUrl: null,
    runtimeSeconds: null,
    publishedAt: null,
  });
  const u = await Upgrade.create({ buildId, title: 'Kit A', area: 'front', episodeId: ep1.id } as never);
  const part = await Part.create({
    buildId,
    upgradeId: u.id,
    partNumber: 'HT-A',
    description: 'Kit A',
    quantity: 1,
    unitCostCents: 10_000,
    retailPriceCents: 19_900,
    supplier: null,
    productUrl: null,
    expectedArrival: null,
    orderedOn: '2026-09-20',
    receivedOn: null,
    state: 'ordered',
  } as never);
  return { buildId, episodeId: ep1.id, partId: part.id };
}

const MAP = {
  orderId: 'Order',
  lineId: 'Line',
  date: 'Date',
  sku: 'SKU',
  quantity: 'Qty',
  revenue: 'Total',
  currency: 'Currency',
  campaign: 'Campaign',
  content: 'Content',
};
const HEAD = 'Order,Line,Date,SKU,Qty,Total,Currency,Campaign,Content';
const url = (buildId: number, q: Record<string, string> = {}) =>
  `/api/builds/${buildId}/sales/import?${new URLSearchParams(q).toString()}`;
const post = (
  role: keyof typeof as,
  buildId: number,
  text: string,
  q: Record<string, string> = {},
  mapping: object | null = MAP,
) =>
  as[role]
    .post(url(buildId, { ...(mapping ? { mapping: JSON.stringify(mapping) } : {}), ...q }))
    .set('Content-Type', 'text/csv')
    .send(text);

beforeAll(async () => {
  as = await agentsByRole();
  tern = (await Build.findOne({ where: { slug: 'project-tern' } }))!;
});

describe('the demo build', () => {
  it('has its export imported at seed time: the owner sees margin, payback and every attribution', async () => {
    const res = await as.owner.get(`/api/builds/${tern.id}/sales`);
    expect(res.status).toBe(200);
    // 209 rows in the file; one is the same order line twice, so 208 lines.
    expect(res.body.linesTotal).toBe(208);
    expect(res.body.series.direct.orders).toBeGreaterThan(0);
    expect(res.body.series.assisted.orders).toBeGreaterThan(0);
    expect(res.body.unattributed.total).toBeGreaterThan(0);
    expect(typeof res.body.series.marginCents).toBe('number');
    expect(typeof res.body.series.netCostCents).toBe('number');
    expect(res.body.payback.points.length).toBeGreaterThan(10);
    expect(res.body.series.revenueCents).toBe(
      res.body.series.direct.revenueCents + res.body.series.assisted.revenueCents,
    );
    // The roof rails sell under the store's own code, recorded on the part as its store SKU.
    const rails = res.body.upgrades.find((u: { title: string }) => u.title === 'Roof rails');
    expect(rails.sinceRelease.units).toBeGreaterThan(0);
  });

  it('marketing and producers see revenue and units but no cost, margin or return', async () => {
    for (const role of ['marketing', 'producer'] as const) {
      const res = await as[role].get(`/api/builds/${tern.id}/sales`);
      expect(res.status).toBe(200);
      expect(res.body.series.revenueCents).toBeGreaterThan(0);
      expect(res.body.episodes[0].direct.units).toBeGreaterThan(0);
      for (const hidden of [
        'marginCents',
        'netCostCents',
        'returnOnBuild',
        'paybackDate',
        'marginNeededCents',
        'payback',
        'cumulativeNetCostCents',
      ]) {
        expect(res.text, `${role} must not receive ${hidden}`).not.toContain(`"${hidden}"`);
      }
      const lines = await as[role].get(`/api/builds/${tern.id}/sales/lines?kind=direct&pageSize=5`);
      expect(lines.status).toBe(200);
      expect(lines.body.lines).toHaveLength(5);
      expect(lines.text).not.toContain('"marginCents"');
    }
    expect((await as.installer.get(`/api/builds/${tern.id}/sales`)).status).toBe(403);
    expect((await anonymous().get(`/api/builds/${tern.id}/sales`)).status).toBe(401);
  });

  it('importing the demo export again changes nothing', async () => {
    const text = fs.readFileSync(TERN_SALES_FILE, 'utf8');
    const before = await as.owner.get(`/api/builds/${tern.id}/sales`);
    const lines = await count('sale_lines');
    const preview = await post('owner', tern.id, text, { dryRun: '1' }, TERN_SALES_MAPPING);
    expect(preview.status).toBe(200);
    expect(preview.body).toMatchObject({
      ok: true,
      linesRead: 209,
      newLines: 0,
      alreadyImported: 208,
      duplicatesInFile: 1,
    });
    const res = await post('owner', tern.id, text, {}, TERN_SALES_MAPPING);
    expect(res.status).toBe(201);
    expect(res.body.added).toBe(0);
    expect(await count('sale_lines')).toBe(lines);
    const after = await as.owner.get(`/api/builds/${tern.id}/sales`);
    expect(after.body.series).toEqual(before.body.series);
    expect(after.body.episodes).toEqual(before.body.episodes);
  });
});

describe('import with a mapping', () => {
  it('previews, writes, remembers the mapping and adds up by hand-worked figures', async () => {
    const { buildId } = await smallBuild('sales-hand');
    const text = [
      HEAD,
      'A1,1,2026-10-02,HT-A,2,398.00,USD,kit-test,episode-1', // direct to ep 1: margin 398 − 2 × 100 = 198
      'A2,1,2026-10-10 09:30:00,ht-a,1,199.00,usd,,', // untagged, day 9 after ep 1: assisted; margin 99
      'A3,1,2026-12-15,HT-A,1,199.00,USD,,', // untagged, day 75: unattributed
      'A1,2,2026-10-20,HT-A,-1,-199.00,USD,,', // refund of one unit of A1: direct to ep 1, margin −99
      'A4,1,2026-10-03,GIFT-50,1,50.00,USD,kit-test,episode-1', // tagged but not a part of the build: unattributed
    ].join('\n');
    const before = await counts(...TABLES);
    const preview = await post('owner', buildId, text, { dryRun: '1' });
    expect(preview.status).toBe(200);
    expect(preview.body).toMatchObject({
      ok: true,
      dryRun: true,
      linesRead: 5,
      newLines: 5,
      alreadyImported: 0,
      refunds: 1,
      errors: [],
    });
    expect(preview.body.sample[1]).toMatchObject({
      line: 3,
      orderId: 'A2',
      soldOn: '2026-10-10',
      quantity: 1,
      revenueCents: 19_900,
      currency: 'USD',
    });
    expect(await counts(...TABLES)).toEqual(before); // a preview writes nothing

    const res = await post('owner', buildId, text, { fileName: 'orders.csv' });
    expect(res.status).toBe(201);
    expect(res.body.added).toBe(5);
    const after = await counts(...TABLES);
    expect(after.sale_lines - before.sale_lines).toBe(5);
    expect(after.sale_imports - before.sale_imports).toBe(1);
    expect(after.sales_mappings - before.sales_mappings).toBe(1);
    expect(after.activities - before.activities).toBe(1);
    expect((await as.marketing.get(`/api/builds/${buildId}/sales/mapping`)).body.mapping).toEqual({
      ...MAP,
      landingUrl: null,
    });

    const s = (await as.owner.get(`/api/builds/${buildId}/sales`)).body;
    const ep1 = s.episodes.find((e: { number: number }) => e.number === 1);
    // Direct: order A1, 2 − 1 = 1 unit, 398.00 − 199.00 = 199.00, margin 198.00 − 99.00 = 99.00.
    expect(ep1.direct).toEqual({ orders: 1, units: 1, revenueCents: 19_900, marginCents: 9_900 });
    // Assisted: order A2, 1 unit, 199.00, margin 99.00.
    expect(ep1.assisted).toEqual({ orders: 1, units: 1, revenueCents: 19_900, marginCents: 9_900 });
    // Unattributed: A3 (199.00, margin 99.00) and A4 (50.00, no part: no margin).
    expect(s.series.unattributed).toEqual({ orders: 2, units: 2, revenueCents: 24_900, marginCents: 9_900 });
    expect(s.unattributed.lines.map((l: { orderId: string }) => l.orderId).sort()).toEqual(['A3', 'A4']);
    // Series: margin 99 + 99 = 198.00 against a net cost of 100.00 (the one part): paid back.
    expect(s.series.marginCents).toBe(19_800);
    expect(s.series.netCostCents).toBe(10_000);
    expect(s.series.returnOnBuild).toBeCloseTo(0.98, 10); // (198 − 100) ÷ 100
    // Cumulative margin: 10-02 198 ≥ 100 → paid back on 10-02 (and it stays above: 297 on 10-10, 198 on 10-20).
    expect(s.series.paybackDate).toBe('2026-10-02');
    expect(s.series.marginNeededCents).toBe(0);

    // Imported again, mapping remembered (none sent): nothing new.
    const again = await post('owner', buildId, text, {}, null);
    expect(again.status).toBe(201);
    expect(again.body.added).toBe(0);
    expect((await counts(...TABLES)).sale_lines).toBe(after.sale_lines);
  });

  it('without line ids, a line is known by order, SKU, quantity and revenue; overlapping exports add only the new lines', async () => {
    const { buildId } = await smallBuild('sales-no-line-ids');
    const map = { ...MAP, lineId: null };
    const first = [
      'Order,Date,SKU,Qty,Total,Currency,Campaign,Content',
      'B1,2026-10-02,HT-A,1,199.00,USD,,',
      'B2,2026-10-03,HT-A,1,199.00,USD,,',
    ].join('\n');
    const second = [first, 'B3,2026-10-04,HT-A,1,199.00,USD,,'].join('\n');
    expect((await post('owner', buildId, first, {}, map)).body.added).toBe(2);
    const res = await post('owner', buildId, second, {}, map);
    expect(res.body).toMatchObject({ added: 1, alreadyImported: 2 });
    expect(await count(`sale_lines WHERE build_id = ${buildId}`)).toBe(3);
  });

  it('reads utm tags from a landing page address', async () => {
    const { buildId, episodeId } = await smallBuild('sales-landing');
    const map = { orderId: 'id', date: 'day', sku: 'sku', quantity: 'n', revenue: 'total', landingUrl: 'landing' };
    const text = [
      'id,day,sku,n,total,landing',
      'C1,2026-11-30,HT-A,1,199.00,https://shop.test/p/ht-a?utm_source=youtube&utm_campaign=kit-test&utm_content=episode-1',
    ].join('\n');
    expect((await post('marketing', buildId, text, {}, map)).status).toBe(201);
    const lines = await as.owner.get(`/api/builds/${buildId}/sales/lines?kind=direct`);
    expect(lines.body.lines).toMatchObject([
      {
        orderId: 'C1',
        attribution: 'direct',
        episodeId,
        campaign: 'kit-test',
        content: 'episode-1',
        marginCents: 9_900,
      },
    ]);
  });
});

describe('bad input: clear messages by line and column, nothing written', () => {
  let buildId: number;
  beforeAll(async () => {
    ({ buildId } = await smallBuild('sales-bad'));
  });

  async function refused(text: string, mapping: object = MAP) {
    const before = await counts(...TABLES);
    const res = await post('owner', buildId, text, {}, mapping);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('bad_csv');
    expect(await counts(...TABLES)).toEqual(before);
    const dry = await post('owner', buildId, text, { dryRun: '1' }, mapping);
    expect(dry.status).toBe(200);
    expect(dry.body.ok).toBe(false);
    expect(dry.body.errors).toEqual(res.body.errors);
    return res.body.errors as { line: number; column: string; message: string }[];
  }

  it('a mapped column that is not in the file', async () => {
    const errors = await refused(
      ['Order,Line,Date,SKU,Qty,Total,Currency,Campaign', 'D1,1,2026-10-02,HT-A,1,199.00,USD,'].join('\n'),
    );
    expect(errors).toEqual([
      { line: 1, column: 'Content', message: 'is not a column of this file (it is mapped as content (utm_content))' },
    ]);
  });

  it('a bad date, a negative quantity on a sale, an unknown and a foreign currency', async () => {
    const errors = await refused(
      [
        HEAD,
        'E1,1,2026-10-02,HT-A,1,199.00,USD,,', // line 2: fine
        'E2,1,10/02/2026,HT-A,1,199.00,USD,,', // line 3: date
        'E3,1,2026-02-30,HT-A,1,199.00,USD,,', // line 4: no such day
        'E4,1,2026-10-02,HT-A,-1,199.00,USD,,', // line 5: negative quantity, positive revenue
        'E5,1,2026-10-02,HT-A,1,199.00,ZZZ,,', // line 6: not a currency
        'E6,1,2026-10-02,HT-A,1,199.00,EUR,,', // line 7: another currency
        'E7,1,2026-10-02,HT-A,1,-199.00,USD,,', // line 8: negative revenue, positive quantity
      ].join('\n'),
    );
    expect(errors).toEqual([
      { line: 3, column: 'Date', message: '"10/02/2026" is not a date (use YYYY-MM-DD, optionally with a time)' },
      { line: 4, column: 'Date', message: '"2026-02-30" is not a date (use YYYY-MM-DD, optionally with a time)' },
      {
        line: 5,
        column: 'Qty',
        message: 'is below zero on a line that is not a refund (a refund has quantity and revenue both below zero)',
      },
      { line: 6, column: 'Currency', message: '"ZZZ" is not a currency code we know' },
      {
        line: 7,
        column: 'Currency',
        message: "EUR is not this build's currency (USD); only USD lines can be imported here",
      },
      {
        line: 8,
        column: 'Total',
        message: 'is below zero on a line that is not a refund (a refund has quantity and revenue both below zero)',
      },
    ]);
  });

  it('cells that look like spreadsheet formulas are refused', async () => {
    const errors = await refused(
      [
        HEAD,
        '=HYPERLINK("http://x.test"),1,2026-10-02,HT-A,1,199.00,USD,,',
        'F2,1,2026-10-02,@SUM(A1),1,199.00,USD,,',
        'F3,1,2026-10-02,HT-A,+1,199.00,USD,,',
        'F4,1,2026-10-02,HT-A,1,199.00,USD,-cmd,',
      ].join('\n'),
    );
    expect(errors.map((e) => `${e.line}:${e.column}`)).toEqual(['2:Order', '3:SKU', '4:Qty', '5:Campaign']);
    expect(errors[0]!.message).toBe('starts with "=" like a spreadsheet formula; such cells are refused');
  });

  it('a mapping that is missing or names one column twice answers 400 naming it', async () => {
    const fresh = await smallBuild('sales-no-mapping');
    const none = await post('owner', fresh.buildId, `${HEAD}\nG1,1,2026-10-02,HT-A,1,199.00,USD,,`, {}, null);
    expect(none.status).toBe(400);
    expect(none.body.error.fields).toEqual([
      expect.objectContaining({ path: 'mapping', message: expect.stringContaining('is required') }),
    ]);
    const twice = await post('owner', fresh.buildId, HEAD, {}, { ...MAP, sku: 'Order' });
    expect(twice.status).toBe(400);
    expect(twice.body.error.fields[0].path).toBe('mapping.sku');
    const notCsv = await as.owner.post(url(fresh.buildId, { mapping: JSON.stringify(MAP) })).send({ a: 1 });
    expect(notCsv.status).toBe(415);
  });

  it('only the owner and marketing may import', async () => {
    for (const role of ['producer', 'installer'] as const) {
      expect((await post(role, buildId, `${HEAD}\nH1,1,2026-10-02,HT-A,1,199.00,USD,,`)).status).toBe(403);
    }
  });
});

describe('settings that sales read', () => {
  it('the build currency decides which lines are accepted, and a part can name its store SKU', async () => {
    const { buildId, partId } = await smallBuild('sales-eur');
    const b = (await as.owner.get(`/api/builds/${buildId}`)).body.build;
    expect(b).toMatchObject({ currency: 'USD', attributionWindowDays: 30 });
    const bad = await as.owner.patch(`/api/builds/${buildId}`).send({ currency: 'XX', version: b.version });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields[0].path).toBe('currency');
    const ok = await as.owner
      .patch(`/api/builds/${buildId}`)
      .send({ currency: 'eur', attributionWindowDays: 10, version: b.version });
    expect(ok.status).toBe(200);
    expect(ok.body.build).toMatchObject({ currency: 'EUR', attributionWindowDays: 10 });

    const part = await as.producer.patch(`/api/builds/${buildId}/parts/${partId}`).send({ storeSku: 'STORE-KIT-A' });
    expect(part.status).toBe(200);
    expect(part.body.part.storeSku).toBe('STORE-KIT-A');

    const text = [HEAD, 'K1,1,2026-10-05,STORE-KIT-A,1,199.00,EUR,,', 'K2,1,2026-10-05,HT-A,1,199.00,USD,,'].join('\n');
    const refused = await post('owner', buildId, text);
    expect(refused.status).toBe(400);
    expect(refused.body.errors).toEqual([
      {
        line: 3,
        column: 'Currency',
        message: "USD is not this build's currency (EUR); only EUR lines can be imported here",
      },
    ]);
    expect((await post('owner', buildId, text.split('\n').slice(0, 2).join('\n'))).status).toBe(201);
    const s = (await as.owner.get(`/api/builds/${buildId}/sales`)).body;
    // Day 4 after the release, within the 10-day window: assisted by the store SKU.
    expect(s.episodes[0].assisted).toEqual({ orders: 1, units: 1, revenueCents: 19_900, marginCents: 9_900 });
  });
});

describe('a large export', () => {
  it('50,000 lines import in one go within the time-out, and again add nothing', async () => {
    const { buildId } = await smallBuild('sales-large');
    const rows = [HEAD];
    for (let i = 0; i < 50_000; i++)
      rows.push(
        `L${i},1,2026-10-${String(1 + (i % 28)).padStart(2, '0')},HT-A,1,199.00,USD,${i % 2 ? 'kit-test' : ''},${i % 2 ? 'episode-1' : ''}`,
      );
    const text = rows.join('\n');
    // Same-run baseline: the first 500 lines into a build of their own.
    const small = await smallBuild('sales-baseline');
    const b0 = Date.now();
    expect((await post('owner', small.buildId, rows.slice(0, 501).join('\n'))).body.added).toBe(500);
    const baselineMs = Date.now() - b0;
    const t0 = Date.now();
    const res = await post('owner', buildId, text);
    const importMs = Date.now() - t0;
    expect(res.status).toBe(201);
    expect(res.body.added).toBe(50_000);
    const t1 = Date.now();
    const again = await post('owner', buildId, text);
    const againMs = Date.now() - t1;
    expect(again.body.added).toBe(0);
    expect(await count(`sale_lines WHERE build_id = ${buildId}`)).toBe(50_000);
    const t2 = Date.now();
    const summary = await as.owner.get(`/api/builds/${buildId}/sales`);
    const summaryMs = Date.now() - t2;
    // 25,000 tagged lines direct; the 25,000 untagged ones are all within 30 days of the release.
    expect(summary.body.series.direct.units).toBe(25_000);
    expect(summary.body.series.assisted.units).toBe(25_000);
    console.log(
      `sales import of 50,000 lines (${(text.length / 1e6).toFixed(1)} MB): ${importMs} ms; again: ${againMs} ms; summary: ${summaryMs} ms; baseline 500 lines: ${baselineMs} ms`,
    );
  }, 60_000);
});
