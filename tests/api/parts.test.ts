// Parts and removed parts API (routes/parts.ts, removedParts.ts): lists, role rules field by field,
// stale updates, bad input, other builds' records.
import { describe, it, expect, beforeAll } from 'vitest';
import { anonymous, agentsByRole } from '../helpers/api';
import { counts } from '../helpers/db';
import { Build, Part, RemovedPart, Upgrade } from '../../server/models';
import { everyAnswerHasAContract } from '../helpers/contract';

everyAnswerHasAContract();

let tern: number;
let other: number;
let otherUpgrade: number;
let otherPart: number;
let upgradeId: number;
let as: Awaited<ReturnType<typeof agentsByRole>>;
const parts = (s = '') => `/api/builds/${tern}/parts${s}`;
const removed = (s = '') => `/api/builds/${tern}/removed-parts${s}`;
const newPart = (over: Record<string, unknown> = {}) => ({
  upgradeId,
  partNumber: 'HT-TEST-1',
  description: 'Test part',
  quantity: 2,
  unitCostCents: 1250,
  retailPriceCents: 2500,
  supplier: 'Northgate OEM Supply',
  ...over,
});

beforeAll(async () => {
  tern = (await Build.findOne({ where: { slug: 'project-tern' } }))!.id;
  upgradeId = (await Upgrade.findOne({ where: { buildId: tern, title: 'Power liftgate' } }))!.id;
  other = (
    await Build.create({
      slug: 'parts-other',
      name: 'Other',
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
  otherUpgrade = (
    await Upgrade.create({
      buildId: other,
      title: 'Other',
      area: 'front',
      replaces: null,
      becomes: null,
      installedOn: null,
      episodeId: null,
      episodePosition: null,
      notes: null,
      tireFrom: null,
      tireTo: null,
    })
  ).id;
  otherPart = (
    await Part.create({
      buildId: other,
      upgradeId: otherUpgrade,
      partNumber: 'HT-O',
      description: 'Other part',
      retailPriceCents: null,
      supplier: null,
      productUrl: null,
      expectedArrival: null,
      orderedOn: null,
      receivedOn: null,
    })
  ).id;
  as = await agentsByRole();
});

describe('GET /parts', () => {
  it('anonymous gets 401', async () => {
    expect((await anonymous().get(parts())).status).toBe(401);
  });
  it('filters by upgrade and state, pages, and removes cost per role', async () => {
    const res = await as.owner.get(parts(`?upgradeId=${upgradeId}`));
    expect(res.status).toBe(200);
    expect(res.body.total).toBe(3);
    expect(res.body.parts.every((p: { upgradeId: number }) => p.upgradeId === upgradeId)).toBe(true);
    expect(res.body.parts[0].unitCostCents).toBeGreaterThan(0);
    const back = await as.owner.get(parts('?state=backordered&pageSize=2'));
    expect(back.body.parts).toHaveLength(2);
    expect(back.body.total).toBeGreaterThanOrEqual(4);
    expect(
      back.body.parts.every(
        (p: { state: string; expectedArrival: string }) => p.state === 'backordered' && p.expectedArrival,
      ),
    ).toBe(true);
    const inst = await as.installer.get(parts('?pageSize=500'));
    expect(inst.body.parts.some((p: object) => 'unitCostCents' in p || 'retailPriceCents' in p)).toBe(false);
    const mkt = await as.marketing.get(parts('?pageSize=500'));
    expect(mkt.body.parts.some((p: object) => 'unitCostCents' in p)).toBe(false);
    expect(mkt.body.parts.some((p: object) => 'retailPriceCents' in p)).toBe(true);
    expect(inst.body.parts.some((p: { id: number }) => p.id === otherPart)).toBe(false);
  });
  it('an unknown state answers 400', async () => {
    expect((await as.owner.get(parts('?state=lost'))).status).toBe(400);
  });
});

describe('POST /parts', () => {
  it('producer adds a part (201), with an activity row', async () => {
    const before = await counts('parts', 'activities');
    const res = await as.producer.post(parts()).send(newPart());
    expect(res.status).toBe(201);
    expect(res.body.part).toMatchObject({
      partNumber: 'HT-TEST-1',
      quantity: 2,
      state: 'to_order',
      condition: 'new',
      version: 0,
    });
    expect(await counts('parts', 'activities')).toEqual({ parts: before.parts + 1, activities: before.activities + 1 });
  });
  it('installer and marketing get 403', async () => {
    for (const r of ['installer', 'marketing'] as const)
      expect((await as[r].post(parts()).send(newPart())).status).toBe(403);
  });
  it.each([
    ['quantity', { quantity: 0 }],
    ['quantity', { quantity: -3 }],
    ['quantity', { quantity: '2' }],
    ['unitCostCents', { unitCostCents: -1 }],
    ['retailPriceCents', { retailPriceCents: 1.5 }],
    ['condition', { condition: 'used' }],
    ['state', { state: 'lost' }],
    ['productUrl', { productUrl: 'javascript:alert(1)' }],
    ['expectedArrival', { expectedArrival: 'next week' }],
    ['partNumber', { partNumber: 'x'.repeat(61) }],
    ['description', { description: '' }],
    ['upgradeId', { upgradeId: 'x' }],
    ['bogus', { bogus: 1 }],
  ])('bad %s answers 400 naming it, nothing written', async (field, over) => {
    const before = await counts('parts', 'activities');
    const res = await as.producer.post(parts()).send(newPart(over));
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { path: string }) => f.path)).toContain(field);
    expect(await counts('parts', 'activities')).toEqual(before);
  });
  it('an upgrade of another build answers 400 naming upgradeId', async () => {
    const before = await counts('parts');
    const res = await as.producer.post(parts()).send(newPart({ upgradeId: otherUpgrade }));
    expect(res.status).toBe(400);
    expect(res.body.error.fields[0].path).toBe('upgradeId');
    expect(await counts('parts')).toEqual(before);
  });
});

describe('PATCH /parts/:partId', () => {
  it('installer may receive a part (receivedOn recorded) but not change its cost, description or other states', async () => {
    const p = (await as.producer.post(parts()).send(newPart({ state: 'ordered', orderedOn: '2026-11-20' }))).body.part;
    const ok = await as.installer.patch(parts(`/${p.id}`)).send({ state: 'received' });
    expect(ok.status).toBe(200);
    expect(ok.body.part.state).toBe('received');
    expect(ok.body.part.receivedOn).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    expect(ok.body.part).not.toHaveProperty('unitCostCents');
    for (const body of [
      { unitCostCents: 1 },
      { description: 'x' },
      { state: 'returned' },
      { productUrl: 'https://shop.cedar-ridge.test/x' },
    ]) {
      expect((await as.installer.patch(parts(`/${p.id}`)).send(body)).status).toBe(403);
    }
    expect((await Part.findByPk(p.id))!.unitCostCents).toBe(1250);
  });
  it('marketing may set only the product page', async () => {
    const p = (await as.producer.post(parts()).send(newPart())).body.part;
    const ok = await as.marketing
      .patch(parts(`/${p.id}`))
      .send({ productUrl: 'https://shop.cedar-ridge.test/parts/ht-test-1' });
    expect(ok.status).toBe(200);
    expect(ok.body.part.productUrl).toBe('https://shop.cedar-ridge.test/parts/ht-test-1');
    expect(ok.body.part.retailPriceCents).toBe(2500);
    expect(ok.body.part).not.toHaveProperty('unitCostCents');
    expect((await as.marketing.patch(parts(`/${p.id}`)).send({ retailPriceCents: 1 })).status).toBe(403);
    expect((await as.marketing.patch(parts(`/${p.id}`)).send({ state: 'received' })).status).toBe(403);
  });
  it('producer changes any field; a stale version answers 409 with the current part', async () => {
    const p = (await as.producer.post(parts()).send(newPart())).body.part;
    const ok = await as.producer
      .patch(parts(`/${p.id}`))
      .send({ version: p.version, unitCostCents: 999, state: 'backordered', expectedArrival: '2026-12-20' });
    expect(ok.status).toBe(200);
    const res = await as.producer.patch(parts(`/${p.id}`)).send({ version: p.version, unitCostCents: 1 });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('stale');
    expect(res.body.error.current).toMatchObject({ id: p.id, unitCostCents: 999 });
  });
  it('another build’s part answers 404 and is unchanged', async () => {
    expect((await as.producer.patch(parts(`/${otherPart}`)).send({ description: 'Mine' })).status).toBe(404);
    expect((await as.producer.delete(parts(`/${otherPart}`))).status).toBe(404);
    expect((await Part.findByPk(otherPart))!.description).toBe('Other part');
  });
});

describe('DELETE /parts/:partId', () => {
  it('producer deletes, installer may not', async () => {
    const p = (await as.producer.post(parts()).send(newPart())).body.part;
    expect((await as.installer.delete(parts(`/${p.id}`))).status).toBe(403);
    expect((await as.producer.delete(parts(`/${p.id}`))).status).toBe(204);
    expect(await Part.findByPk(p.id)).toBeNull();
  });
});

describe('removed parts', () => {
  it('everyone reads them; sale prices only for money roles', async () => {
    const o = await as.owner.get(removed());
    expect(o.status).toBe(200);
    const sold = o.body.removedParts.filter((r: { disposition: string }) => r.disposition === 'sold');
    expect(sold.length).toBeGreaterThanOrEqual(2);
    expect(sold[0].actualSaleCents).toBeGreaterThan(0);
    for (const r of ['installer', 'marketing'] as const) {
      const res = await as[r].get(removed());
      expect(res.status).toBe(200);
      expect(res.body.removedParts.some((x: object) => 'expectedSaleCents' in x || 'actualSaleCents' in x)).toBe(false);
    }
  });
  it('producer records a removed part and marks it sold', async () => {
    const before = await counts('removed_parts', 'activities');
    const res = await as.producer
      .post(removed())
      .send({ upgradeId, description: 'Gas struts, spare', disposition: 'for_sale', expectedSaleCents: 3000 });
    expect(res.status).toBe(201);
    const id = res.body.removedPart.id;
    const sold = await as.producer
      .patch(removed(`/${id}`))
      .send({ disposition: 'sold', actualSaleCents: 2800, soldOn: '2026-11-30' });
    expect(sold.status).toBe(200);
    expect(sold.body.removedPart).toMatchObject({ disposition: 'sold', actualSaleCents: 2800, soldOn: '2026-11-30' });
    expect(await counts('removed_parts', 'activities')).toEqual({
      removed_parts: before.removed_parts + 1,
      activities: before.activities + 2,
    });
    expect((await as.installer.delete(removed(`/${id}`))).status).toBe(403);
    expect((await as.producer.delete(removed(`/${id}`))).status).toBe(204);
  });
  it.each([
    ['disposition', { disposition: 'lost' }],
    ['expectedSaleCents', { expectedSaleCents: -1 }],
    ['soldOn', { soldOn: '2026-11-31' }],
    ['description', { description: 'x'.repeat(201) }],
  ])('bad %s answers 400, nothing written', async (field, over) => {
    const before = await counts('removed_parts', 'activities');
    const res = await as.producer.post(removed()).send({ description: 'Bad', ...over });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { path: string }) => f.path)).toContain(field);
    expect(await counts('removed_parts', 'activities')).toEqual(before);
  });
  it('another build’s removed part answers 404; an upgrade of another build answers 400', async () => {
    const r = await RemovedPart.create({
      buildId: other,
      upgradeId: null,
      description: 'Other',
      partNumber: null,
      expectedSaleCents: null,
      actualSaleCents: null,
      soldOn: null,
    });
    expect((await as.producer.patch(removed(`/${r.id}`)).send({ disposition: 'sold' })).status).toBe(404);
    const res = await as.producer.post(removed()).send({ description: 'x', upgradeId: otherUpgrade });
    expect(res.status).toBe(400);
    expect(res.body.error.fields[0].path).toBe('upgradeId');
  });
});
